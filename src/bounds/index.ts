/**
 * Exact Durbin-Watson bounds for any n, k' and alpha (Durbin & Watson 1950, 1951; docs/methods.md
 * section 2): the bounding spectra, d_L and d_U, the bounds-test zone of an observed d with its
 * exact resolution, and whole tables computed on the spot.
 */
export { bounds, checkBoundsAlpha, type BoundsOptions, type DwBounds } from './bounds.js';
export {
  lowerBoundSpectrum, upperBoundSpectrum, lowerBoundIndices, upperBoundIndices, differenceEigenvalue,
  checkBoundsDesign, MAX_BOUNDS_N, type BoundIndices,
} from './spectra.js';
export { boundQuantile, boundTail, type BoundQuantile, type BoundQuantileOptions } from './quantile.js';
export { cosineSpectrumForm } from './cosine-form.js';
export { boundsZone, zoneOf, formatPValue, type BoundsZoneOptions } from './zone.js';
export {
  boundsTable, checkTableRequest, MAX_TABLE_CELLS, MAX_TABLE_WORK,
  type BoundsTable, type BoundsTableCell, type BoundsTableRequest,
} from './table.js';
export { parseIntegerList, parseLevelList } from './ranges.js';
