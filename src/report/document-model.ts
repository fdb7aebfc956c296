/**
 * The document model of a report, independent of its format: sections of blocks (paragraphs,
 * labelled values, tables, lists, the references), written in the neutral markup of format.ts.
 * Every renderer (text, Markdown, LaTeX) prints one such document. No formula.
 */

/** A paragraph. */
export interface ParagraphBlock { kind: 'para'; text: string }
/** Labelled values, one per row. */
export interface FieldsBlock { kind: 'fields'; rows: [label: string, value: string][] }
/** A table with a header row. */
export interface TableBlock { kind: 'table'; head: string[]; align: ('l' | 'r')[]; rows: string[][] }
/** A bulleted list. */
export interface ListBlock { kind: 'list'; items: string[] }
/** The reference list: works by BibTeX key, in order of first citation. */
export interface ReferencesBlock { kind: 'references'; keys: string[] }
export type ReportBlock = ParagraphBlock | FieldsBlock | TableBlock | ListBlock | ReferencesBlock;

/** One section of a report. */
export interface ReportSection {
  /** Stable identifier (used for anchors and by the tests). */
  id: string;
  heading: string;
  blocks: ReportBlock[];
}

/** A whole report in neutral markup. */
export interface ReportDocument {
  title: string;
  /** "exact-dw 0.1.0" */
  producer: string;
  sections: ReportSection[];
}

/** Decimals of d, critical values and bounds in the reports. */
export const D_DECIMALS = 4;

/** Decimals of the asymptotic statistics (h, LM, F, t). */
export const STAT_DECIMALS = 4;

/** A paragraph block. */
export const para = (text: string): ParagraphBlock => ({ kind: 'para', text });
