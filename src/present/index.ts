/**
 * The presentation layer shared by src/cli, src/ui and src/report: display
 * units (NIST SP 811 factors), one number style, text layout and the
 * glossary of the words the screens show. Pure; imports no cli, ui or report.
 */
export * from './number.js';
export * from './units.js';
export * from './text.js';
export * from './glossary.js';
export * from './words.js';
