/**
 * One CSV cell (RFC 4180): quoted when it holds a comma, quote or line break; a leading =, +, -
 * or @ is prefixed with an apostrophe so a spreadsheet does not run a name as a formula.
 */
export function csvCell(text: string): string {
  const safe = /^[=+\-@]/.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}
