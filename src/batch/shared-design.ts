/**
 * One null distribution per design: series whose prepared design is the same, bit for bit, share
 * the prepared problem (its QR factorisation, its spectrum, its critical values), so that a batch
 * of series on one design costs one spectrum and one pair of critical values, and sharing never
 * changes a number: every shared value is exactly what a fresh preparation would compute, because
 * preparation is a pure function of the design, the times and the options.
 */
import { DwNullDistribution } from '../distribution/null-distribution.js';
import { buildDesign, type RegressorInput } from '../model/design.js';
import { differenceOperator, prepareDesign, type DifferenceOperator, type DwProblem, type ProblemOptions } from '../problem/problem.js';
import type { DesignReuse } from '../inference/dw-test.js';
import { bounds as boundsOf } from '../bounds/bounds.js';
import { densityCeiling } from './group-test.js';

/** A null distribution that remembers its critical values (computed once by the same code). */
class RememberingDistribution extends DwNullDistribution {
  private readonly lower = new Map<number, number>();
  private readonly upper = new Map<number, number>();

  override quantile(p: number): number {
    let v = this.lower.get(p);
    if (v === undefined) { v = super.quantile(p); this.lower.set(p, v); }
    return v;
  }

  override upperQuantile(p: number): number {
    let v = this.upper.get(p);
    if (v === undefined) { v = super.upperQuantile(p); this.upper.set(p, v); }
    return v;
  }
}

/** The exact bytes of a design as prepared (values, names, intercept rule), its times and options. */
function fingerprintBytes(x: Float64Array, times: ArrayLike<number> | undefined): Uint8Array {
  const t = times ? Float64Array.from(times) : new Float64Array(0);
  const out = new Uint8Array(x.byteLength + t.byteLength + 8);
  out.set(new Uint8Array(x.buffer, x.byteOffset, x.byteLength), 0);
  new DataView(out.buffer).setFloat64(x.byteLength, times ? t.length : -1);
  out.set(new Uint8Array(t.buffer, t.byteOffset, t.byteLength), x.byteLength + 8);
  return out;
}

/** FNV-1a over the bytes, 32-bit word by word (only to bucket designs; equality is decided on the bytes themselves). */
function fnv1a(bytes: Uint8Array): number {
  const words = new Int32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength >> 2);
  let h = 0x811c9dc5;
  for (let i = 0; i < words.length; i++) { h ^= words[i]; h = Math.imul(h, 0x01000193); }
  for (let i = words.length << 2; i < bytes.length; i++) { h ^= bytes[i]; h = Math.imul(h, 0x01000193); }
  return h >>> 0;
}

function sameBytes(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  // fingerprints are whole 8-byte values from offset 0: compare them 32 bits at a time
  if (a.length % 4 === 0 && a.byteOffset % 4 === 0 && b.byteOffset % 4 === 0) {
    const wa = new Int32Array(a.buffer, a.byteOffset, a.length >> 2);
    const wb = new Int32Array(b.buffer, b.byteOffset, b.length >> 2);
    for (let i = 0; i < wa.length; i++) if (wa[i] !== wb[i]) return false;
    return true;
  }
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

function sameTimes(a: Float64Array | undefined, b: ArrayLike<number> | undefined): boolean {
  if (a === undefined || b === undefined) return a === b;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Series on one design after which its density ceiling replaces a slope per series. */
export const SHARED_CEILING_USES = 8;

interface Entry { bytes: Uint8Array; id: number; reuse?: DesignReuse; error?: unknown }

/**
 * Prepared designs, found by their exact bytes after the same preparation (the design as built by
 * `buildDesign`: its values, column names, intercept rule; the times; the lag, engine and
 * tolerance). Keep one per batch.
 *
 * @example
 * ```ts
 * const designs = new DesignCache({ lag: 1 });
 * const a = designs.lookup({ t: [1, 2, 3, 4, 5, 6] }, 6);
 * const b = designs.lookup({ t: [1, 2, 3, 4, 5, 6] }, 6);
 * a.reuse === b.reuse; // true: one prepared problem, one spectrum
 * designs.size; // 1
 * ```
 */
export class DesignCache {
  private readonly buckets = new Map<string, Entry[]>();
  private readonly dLdU = new Map<string, { dL: number; dU: number }>();
  private count = 0;
  private readonly uses = new Map<number, number>();
  private readonly ceilings = new Map<number, number | null>();
  private lastDifference: { n: number; times: Float64Array | undefined; difference: DifferenceOperator } | null = null;
  /** Number of series that found their design already prepared. */
  hits = 0;

  constructor(private readonly options: ProblemOptions) {}

  /** Number of distinct designs prepared (a design that could not be prepared is not counted). */
  get size(): number { return this.count; }

  /**
   * The prepared problem for regressors `x` (n rows) and times, preparing it on first sight. A
   * design that cannot be prepared (rank-deficient, too large, ...) throws the same DwError every
   * time it is looked up.
   */
  lookup(x: RegressorInput, n: number, times?: ArrayLike<number>): { id: number; reuse: DesignReuse } {
    const opts: ProblemOptions = { ...this.options, times };
    const design = buildDesign(x, n, { intercept: opts.intercept, names: opts.names });
    const bytes = fingerprintBytes(design.x, times);
    const key = `${n}|${design.k}|${design.interceptAdded}|${design.names.join('\u0000')}|${fnv1a(bytes)}`;
    let bucket = this.buckets.get(key);
    if (!bucket) { bucket = []; this.buckets.set(key, bucket); }
    let entry = bucket.find((e) => sameBytes(e.bytes, bytes));
    if (entry) {
      this.hits++;
    } else {
      entry = { bytes, id: -1 };
      bucket.push(entry);
      try {
        const problem = prepareDesign(design, opts, this.difference(n, times));
        const distribution = new RememberingDistribution(problem.distribution.source, problem.distribution.options);
        const shared: DwProblem = { ...problem, distribution, warnings: [...problem.warnings] };
        entry.reuse = { problem: shared, bounds: (nn, kPrime, level) => this.bounds(nn, kPrime, level) };
        // numbered once prepared: the numbers are those of the null distributions, without gaps
        entry.id = this.count++;
      } catch (err) {
        entry.error = err;
      }
    }
    if (entry.error !== undefined) throw entry.error;
    // each series gets its own copy of the warning list (the test appends to its own)
    const { problem, bounds } = entry.reuse!;
    return { id: entry.id, reuse: { problem: { ...problem, warnings: [...problem.warnings] }, bounds } };
  }

  /**
   * A ceiling of the density of d for a design used by many series (from its
   * {@link SHARED_CEILING_USES}-th series on; null before, and for small m), computed once.
   */
  ceiling(id: number, reuse: DesignReuse): number | null {
    const uses = (this.uses.get(id) ?? 0) + 1;
    this.uses.set(id, uses);
    if (uses < SHARED_CEILING_USES) return null;
    if (!this.ceilings.has(id)) this.ceilings.set(id, densityCeiling(reuse));
    return this.ceilings.get(id)!;
  }

  /** The differences for n observations at these times: those of the previous design when the times are the same. */
  private difference(n: number, times: ArrayLike<number> | undefined): DifferenceOperator {
    const last = this.lastDifference;
    if (last && last.n === n && sameTimes(last.times, times)) return last.difference;
    const difference = differenceOperator(n, this.options.lag ?? 1, times);
    this.lastDifference = { n, times: times ? Float64Array.from(times) : undefined, difference };
    return difference;
  }

  private bounds(n: number, kPrime: number, level: number): { dL: number; dU: number } {
    const key = `${n}|${kPrime}|${level}`;
    let v = this.dLdU.get(key);
    if (!v) {
      // the same call as the single test makes (src/bounds/zone.ts): the same numbers
      const b = boundsOf(n, kPrime, level, { intercept: true, method: undefined });
      v = { dL: b.dL, dU: b.dU };
      this.dLdU.set(key, v);
    }
    return v;
  }
}
