/**
 * The standard PDF fonts (Helvetica) carry only the Windows-1252 ("WinAnsi") character set, so a
 * character outside it prints as a wrong glyph. Every text on the sheet passes through here once,
 * so the SVG and the PDF show the same words.
 *
 * @example
 *   toWinAnsi('≥ 99 % − ±2 m, Łódź')  // '>= 99 % - ±2 m, Lodz'
 */

/** Characters above U+00FF that Windows-1252 has (its 0x80–0x9F block). */
const CP1252_EXTRAS = new Set([
  0x20ac, 0x201a, 0x0192, 0x201e, 0x2026, 0x2020, 0x2021, 0x02c6, 0x2030, 0x0160, 0x2039, 0x0152, 0x017d,
  0x2018, 0x2019, 0x201c, 0x201d, 0x2022, 0x2013, 0x2014, 0x02dc, 0x2122, 0x0161, 0x203a, 0x0153, 0x017e, 0x0178,
]);

/** Common characters outside the set, written out in ones it has. */
const REPLACEMENTS: Record<string, string> = {
  '\u2265': '>=',
  '\u2264': '<=',
  '\u2212': '-',
  '\u2010': '-',
  '\u2011': '-',
  '\u2248': '~',
  '\u2192': '->',
  '\u2190': '<-',
  '\u2191': '^',
  '\u2193': 'v',
  // No-break spaces are in the set, but readers copy them out as plain spaces; writing plain
  // spaces keeps the SVG, the PDF and the text pulled from it the same.
  '\u00a0': ' ',
  '\u2009': ' ',
  '\u202f': ' ',
  '\u2007': ' ',
  '\u2032': "'",
  '\u2033': '"',
  '\u03c7': 'chi',
  '\u03c3': 'sd',
  '\u0141': 'L',
  '\u0142': 'l',
  '\u0110': 'D',
  '\u0111': 'd',
  '\u0131': 'i',
  '\u2713': 'yes',
  '\u2717': 'no',
};

function fits(code: number): boolean {
  if (code === 0x0a) return true;
  if (code < 0x20 || code === 0x7f) return false;
  if (code < 0x80) return true;
  if (code >= 0xa0 && code <= 0xff) return true;
  return CP1252_EXTRAS.has(code);
}

/** The text with every character the standard fonts cannot show replaced by a near equivalent. */
export function toWinAnsi(text: string): string {
  let out = '';
  for (const char of text) {
    const code = char.codePointAt(0)!;
    if (fits(code) && code !== 0xa0) {
      out += char;
      continue;
    }
    const replacement = REPLACEMENTS[char];
    if (replacement !== undefined) {
      out += replacement;
      continue;
    }
    // Accented letters: drop the accent (ő -> o) when the base letter fits.
    const base = char.normalize('NFD').replace(/[\u0300-\u036f]/g, '');
    out += base.length > 0 && [...base].every((c) => fits(c.codePointAt(0)!)) ? base : '?';
  }
  return out;
}

/** How many characters of `text` toWinAnsi prints as '?' (no near equivalent in the set). */
export function unprintableCount(text: string): number {
  let count = 0;
  for (const char of text) if (char !== '?' && toWinAnsi(char) === '?') count++;
  return count;
}
