/**
 * Benchmark of the bounds table: the whole grid n = 6..200 x k' = 1..20 x alpha in {5%, 1%} (the
 * range of the printed tables, Savin & White 1977), d_L and d_U in every cell, against the target
 * "under 10 s on one core". Cells with n < k' + 3 have fewer than 2 residual degrees of freedom and
 * are left out, as in the printed tables (306 of the 7800). Run with `npm run bench:bounds`.
 *
 * Printed, all measured in this one run:
 *   - CPU time of this process (user + system) and wall-clock time of the grid, and the ratio of the
 *     CPU time to the 10 s target (CPU time is the fair "one core" measure on a shared machine;
 *     node runs the computation on one thread);
 *   - Imhof integrals per quantile;
 *   - the same quantiles by the general route (bounds(..., { method: 'imhof' }), that is
 *     DwNullDistribution.fromSpectrum(...).quantile with the
 *     O(m) Imhof integrand and a cold-start root finder) on a sample of cells, its extrapolated time for
 *     the whole grid, the speed-up, and the largest difference between the two routes.
 *
 * Options: --quick (a smaller sample of the general route).
 */
import { boundsTable } from '../src/bounds/table.js';
import { bounds } from '../src/bounds/bounds.js';

const QUICK = process.argv.includes('--quick');
const TARGET_SECONDS = 10;

const range = (a: number, b: number, step = 1) => Array.from({ length: Math.floor((b - a) / step) + 1 }, (_, i) => a + i * step);

function cpuSeconds(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
}

// 1. the grid by the table route (closed-form integrand, warm starts)
const grid = { n: range(6, 200), kPrime: range(1, 20), alpha: [0.05, 0.01] };
const cpu0 = cpuSeconds();
const wall0 = performance.now();
const table = boundsTable(grid);
const wall = (performance.now() - wall0) / 1000;
const cpu = cpuSeconds() - cpu0;
const quantiles = 2 * table.cells.length;

// 2. a sample of the same cells by the general route
const sampleN = QUICK ? range(10, 200, 95) : range(10, 200, 38);
const sampleK = QUICK ? [1, 20] : [1, 10, 20];
let sampleCpu = 0;
let sampleQuantiles = 0;
let maxDiff = 0;
for (const alpha of grid.alpha) {
  for (const n of sampleN) {
    for (const k of sampleK) {
      if (n < k + 3) continue;
      const c0 = cpuSeconds();
      const b = bounds(n, k, alpha, { method: 'imhof' });
      sampleCpu += cpuSeconds() - c0;
      sampleQuantiles += 2;
      const cell = table.cells.find((c) => c.n === n && c.kPrime === k && c.alpha === alpha);
      if (cell) maxDiff = Math.max(maxDiff, Math.abs(cell.dL - b.dL), Math.abs(cell.dU - b.dU));
    }
  }
}
const perQuantileGeneral = sampleCpu / sampleQuantiles;
const generalGrid = perQuantileGeneral * quantiles;

const fmt = (x: number, d = 2) => x.toFixed(d);
const lines = [
  "Bounds table benchmark: n = 6..200, k' = 1..20, alpha = 0.05 and 0.01 (d_L and d_U per cell)",
  `  cells computed                 ${table.cells.length} (${table.skipped} left out: n < k' + 3)`,
  `  quantiles                      ${quantiles}`,
  `  Imhof integrals per quantile   ${fmt(table.evaluations / quantiles)}`,
  `  CPU time (one thread)          ${fmt(cpu)} s   ratio to the ${TARGET_SECONDS} s target: ${fmt(cpu / TARGET_SECONDS)}  (${cpu < TARGET_SECONDS ? 'met' : 'NOT met'})`,
  `  wall-clock time                ${fmt(wall)} s   (above the CPU time when other processes share the cores)`,
  '',
  `General route (bounds with method imhof: DwNullDistribution quantile, O(m) integrand, cold start) on ${sampleQuantiles} sampled quantiles:`,
  `  CPU time per quantile          ${fmt(perQuantileGeneral * 1000, 1)} ms   (table route: ${fmt((cpu / quantiles) * 1000, 2)} ms)`,
  `  whole grid, extrapolated       ${fmt(generalGrid, 0)} s   ratio to the ${TARGET_SECONDS} s target: ${fmt(generalGrid / TARGET_SECONDS, 1)}`,
  `  speed-up of the table route    ${fmt(generalGrid / cpu, 1)} x`,
  `  largest difference             ${maxDiff.toExponential(1)} (both routes solve to about 1e-9)`,
];
process.stdout.write(lines.join('\n') + '\n');
