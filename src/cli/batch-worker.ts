/**
 * Node-only worker thread of `exact-dw batch` (src/cli/batch-pool.ts): test a run of groups and
 * send the results back, with progress every few groups. The thread starts before its job is
 * ready (it loads while the main thread reads the file) and waits for one message: the job.
 */
import { parentPort } from 'node:worker_threads';
import { isDwError } from '../errors.js';
import { runBatchJob, type BatchJob, type BatchWorkerMessage } from './batch-pool.js';

parentPort!.once('message', (job: BatchJob) => {
  const post = (m: BatchWorkerMessage) => parentPort!.postMessage(m);
  const step = Math.max(1, Math.floor(job.grouping.labels.length / 100));
  try {
    const { groups, designs } = runBatchJob(job, (done) => { if (done % step === 0) post({ kind: 'progress', done }); });
    post({ kind: 'done', groups, designs });
  } catch (err) {
    if (!isDwError(err)) throw err;
    post({ kind: 'error', code: err.code, message: err.message, hint: err.hint, detail: err.detail });
  }
});
