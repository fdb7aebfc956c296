/**
 * Shared helpers of the power tests: the notes of a power result in words, as a report prints them.
 */
import { powerNoteText } from '../../src/report/wording.js';
import { inline } from '../../src/report/format.js';
import type { PowerNote } from '../../src/power/exact-power.js';

/** The notes of a power result as plain text, joined. */
export const notesText = (notes: PowerNote[]): string => notes.map((n) => inline(powerNoteText(n), 'text')).join(' ');
