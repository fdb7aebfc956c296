/**
 * Where to cut Imhof's integral (Imhof 1961, Biometrika 48, 419-426) without knowing the weights:
 * log rho(u) = (1/4) sum log(1 + lambda_j^2 u^2) is convex in log u (each term is log(1 + e^y)
 * with y affine in log u), so with the secant slope g of log rho over [U/2, U] (at most its slope
 * at U, hence at every u >= U),
 *
 *   log rho(u) >= log rho(U) + g log(u / U)   (u >= U),
 *
 * and (1/pi) Integral_U^inf |sin theta| / (u rho) du <= 1 / (pi g rho(U)). This holds for any
 * weights, also for a weight that is zero or below any floor, and needs two evaluations of log rho.
 */

/**
 * The first U = start 2^i whose tail bound `bound(U, log rho(U), g)` is at most `target` (g the
 * secant slope above, reduced by a margin for the rounding of log rho); Infinity as the bound if
 * none is found before U overflows.
 *
 * @example
 * ```ts
 * const cut = convexityCut((u) => logRhoAt(u), 0.01, 2.5e-12, (_u, lr, g) => Math.exp(-lr) / (Math.PI * g));
 * cut.upper;      // where to stop integrating
 * cut.truncation; // the bound on what is left out
 * ```
 */
export function convexityCut(
  logRho: (u: number) => number,
  start: number,
  target: number,
  bound: (u: number, logRhoU: number, slope: number) => number,
): { upper: number; truncation: number } {
  let u = start;
  let prev = logRho(u / 2);
  for (let i = 0; i < 2100; i++) {
    const lr = logRho(u);
    const slope = (lr - prev - 1e-9 * (1 + Math.abs(lr))) / Math.LN2;
    const t = slope > 0 ? bound(u, lr, slope) : Infinity;
    if (t <= target || !(2 * u < 1e300)) return { upper: u, truncation: t };
    prev = lr;
    u *= 2;
  }
  return { upper: u, truncation: Infinity };
}

/**
 * The tail bound of a probability integral: 1 / (pi g rho(U)).
 *
 * @example
 * ```ts
 * probabilityTailBound(1, 30, 2); // exp(-30) / (2 pi)
 * ```
 */
export function probabilityTailBound(_u: number, logRhoU: number, slope: number): number {
  return Math.exp(-logRhoU) / (Math.PI * slope);
}
