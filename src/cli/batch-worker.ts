/**
 * Node-only worker thread of `exact-dw batch` (src/cli/batch-pool.ts): test a run of groups and
 * send the results back, with progress every few groups.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { isDwError } from '../errors.js';
import { runBatchJob, type BatchJob, type BatchWorkerMessage } from './batch-pool.js';

const job = workerData as BatchJob;
const post = (m: BatchWorkerMessage) => parentPort!.postMessage(m);
const step = Math.max(1, Math.floor(job.grouping.labels.length / 100));
try {
  const { groups, designs } = runBatchJob(job, (done) => { if (done % step === 0) post({ kind: 'progress', done }); });
  post({ kind: 'done', groups, designs });
} catch (err) {
  if (!isDwError(err)) throw err;
  post({ kind: 'error', code: err.code, message: err.message, hint: err.hint });
}
