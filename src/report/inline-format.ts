/**
 * The output formats of the renderers, in a module of its own so that the number formatting
 * (format.ts) and the reference list (citations.ts) can both name it without importing each other.
 */

/** Output formats of the renderers. */
export type InlineFormat = 'text' | 'markdown' | 'latex';
