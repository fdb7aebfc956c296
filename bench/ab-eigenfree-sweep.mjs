// Before/after timing of the eigen-free sweeps (the engine's characteristic form and the power
// form under AR(1) errors, tridiagonal and band cases, k = 3, n = 10^4 and 10^5) for two builds of
// the library, alternating between them in one process and keeping the best of 12 rounds:
//   git worktree add /tmp/old <commit> && (cd /tmp/old && npm ci && npm run build)
//   npm run build && node bench/ab-eigenfree-sweep.mjs /tmp/old/dist/src dist/src
// Prints ms per evaluation of each form and the ratio after / before. Used when the sweeps were
// merged into src/linalg/band-ldl.ts. Both builds need the layout with src/linalg/ (commit bd09b87 or later).
import path from 'node:path';
import { pathToFileURL } from 'node:url';
if (process.argv.length < 4) {
  console.error('usage: node bench/ab-eigenfree-sweep.mjs BEFORE/dist/src AFTER/dist/src');
  process.exit(2);
}
const [A, B] = process.argv.slice(2, 4).map((p) => pathToFileURL(path.resolve(p)).href);
const load = async (base) => ({
  ef: (await import(base + '/engines/eigenfree.js')).eigenfreeForm,
  pw: await import(base + '/power/eigenfree-power.js'),
  qr: await import(base + '/linalg/qr.js'),
  df: await import(base + '/core/difference.js'),
});
const mods = [await load(A), await load(B)];
let seed = 7; const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
const out = new Float64Array(2);
for (const n of [10000, 100000]) {
  const k = 3; const x = new Float64Array(n * k); for (let i = 0; i < n; i++) { x[i] = 1; x[n + i] = i / n; x[2 * n + i] = rnd(); }
  const b0 = new Float64Array(n), b1 = new Float64Array(n - 1), b2 = new Float64Array(n - 2); for (let i = 0; i < n; i++) b0[i] = 2 + rnd(); for (let i = 0; i < n - 1; i++) b1[i] = -0.5 * rnd(); for (let i = 0; i < n - 2; i++) b2[i] = 0.3 * rnd();
  const ag = { n, bandwidth: 2, bands: [b0, b1, b2] };
  const forms = mods.map((m) => {
    const basis = m.qr.columnBasis(m.qr.householderQR(x, n, k));
    const a1 = m.df.differenceMatrix(m.df.differencePairs(n, 1)), a2 = m.df.differenceMatrix(m.df.differencePairs(n, 2));
    return [
      ['eigenfree, tridiagonal (lag 1)', m.ef(a1, basis, 1.8)],
      ['eigenfree, band (p = 2)', m.ef(ag, basis, 2.0)],
      ['power, tridiagonal (lag 1)', m.pw.alternativeForm(m.pw.alternativeStructure(basis, a1, 1), 1.8, 0.5)],
      ['power, band (lag 2)', m.pw.alternativeForm(m.pw.alternativeStructure(basis, a2, 2), 1.8, 0.5)],
    ];
  });
  const reps = n === 10000 ? 30 : 4;
  for (let c = 0; c < 4; c++) {
    const best = [Infinity, Infinity];
    for (let round = 0; round < 12; round++) for (let v = 0; v < 2; v++) {
      const f = forms[v][c][1];
      const t0 = process.hrtime.bigint();
      for (let i = 0; i < reps; i++) f.evaluate(0.5 + i * 0.01, out);
      best[v] = Math.min(best[v], Number(process.hrtime.bigint() - t0) / 1e6 / reps);
    }
    console.log(`n = ${n}\t${forms[0][c][0]}\tbefore ${best[0].toFixed(3)} ms\tafter ${best[1].toFixed(3)} ms\tratio ${(best[1] / best[0]).toFixed(2)}`);
  }
}
