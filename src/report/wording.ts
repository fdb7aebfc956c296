/**
 * The human wording of the typed notes that results carry (`{ code, ...plain fields }`), in one
 * place shared by the reports, the command line and the page. Results hold only the codes and
 * their numbers; everything a person reads is made here.
 */

/** A note on a pooled panel design. */
export type PanelNote =
  | { code: 'PANEL_BOUNDS_NOT_APPLICABLE'; entities: number }
  | { code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE'; entities: number };

/** A note on a batch of series. */
export type BatchNote =
  | { code: 'BATCH_GROUPS_FAILED'; failed: number; groups: number }
  | { code: 'BATCH_NOT_VALID_EXCLUDED'; excluded: number }
  | { code: 'BATCH_ADJUSTED'; method: 'holm' | 'bh'; family: number };

/** Every typed note. */
export type Note = PanelNote | BatchNote;

/** What every batch table states under it. */
export const BATCH_ASSUMPTIONS = 'Each p-value is exact for its own design under the null of independent, normally distributed errors with constant variance, with exogenous regressors (no lagged dependent variable); the table supports, and does not replace, the judgement of the analyst.';

/** Full names of the adjustments, for tables and reports. */
export const ADJUSTMENT_NAMES: Record<'holm' | 'bh', string> = {
  holm: 'Holm (1979) step-down, family-wise error rate',
  bh: 'Benjamini-Hochberg (1995) step-up, false discovery rate',
};

/**
 * One sentence for a typed note.
 *
 * @example
 * ```ts
 * noteText({ code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE', entities: 12 });
 * // "With one indicator per entity (12 entities) instead of the intercept, ..."
 * ```
 */
export function noteText(note: Note): string {
  switch (note.code) {
    case 'PANEL_BOUNDS_NOT_APPLICABLE':
      return `The pooled panel has ${note.entities} entities, so d is made of ${note.entities} separate chains of differences: the classical bounds d_L and d_U (one chain, one intercept) do not apply; the exact p-value for this design does.`;
    case 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE':
      return `With one indicator per entity (${note.entities} entities) instead of the intercept, the classical bounds d_L and d_U (which assume a single intercept and one chain of differences) do not apply; the exact p-value for this design does.`;
    case 'BATCH_GROUPS_FAILED':
      return `${note.failed} of ${note.groups} groups could not be tested; each has its error code and message, and the others are unaffected.`;
    case 'BATCH_NOT_VALID_EXCLUDED':
      return `${note.excluded} group${note.excluded === 1 ? ' has' : 's have'} a lagged dependent variable among the regressors, so d is not a valid test there; ${note.excluded === 1 ? 'it is' : 'they are'} left out of the adjusted family.`;
    case 'BATCH_ADJUSTED':
      return `p-values adjusted over the ${note.family} groups tested by ${ADJUSTMENT_NAMES[note.method]}; decisions use the adjusted p-values.`;
  }
}
