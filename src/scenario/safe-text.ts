/**
 * Text from the user (names of the scenario, areas, stages, failure modes) on its way into the
 * files Strewn writes.
 *
 * CSV: a cell that begins with `=`, `+`, `-`, `@`, a tab or a carriage return is read by
 * spreadsheet programs as a formula (OWASP, "CSV Injection"). Such a cell gets a leading
 * apostrophe, the common practice that makes spreadsheets show it as text; plain numbers such as
 * `-12.5` are left as they are. `strewn analyze` removes that apostrophe again when it reads the
 * cell back.
 *
 * XML (KML, SVG): XML 1.0 (W3C, section 2.2 "Characters") allows no control characters except tab,
 * line feed and carriage return, and no U+FFFE/U+FFFF or unpaired surrogates, not even escaped.
 * They are dropped.
 */

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A CSV cell that no spreadsheet runs as a formula. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** Undoes `neutraliseFormula` for a cell read back from a CSV Strewn wrote. */
export function restoreFormulaText(text: string): string {
  return text.length > 1 && text[0] === "'" && FORMULA_START.test(text.slice(1)) && !PLAIN_NUMBER.test(text.slice(1)) ? text.slice(1) : text;
}

// Control characters but tab, LF, CR; U+FFFE, U+FFFF; a high surrogate not followed by a low one, a low one not preceded by a high one.
const NOT_XML = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** The text without the characters XML 1.0 forbids. */
export function xmlCharacters(text: string): string {
  return text.replace(NOT_XML, '');
}

/** Control characters refused in names (U+0000–U+001F but tab and line feed, and U+007F). */
export const NAME_CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f]/;

/** The first 60 characters of a line of a file, for an error message (never more of the file). */
export function excerpt(line: string, max = 60): string {
  const clean = line.replace(/[\u0000-\u001f\u007f]/g, ' ');
  return clean.length <= max ? clean : `${clean.slice(0, max - 1)}…`;
}
