/**
 * Characters our messages use that the PDF standard fonts (WinAnsi encoding) cannot show, and their plain
 * stand-ins. Everything else outside WinAnsi becomes "?" so a report never shows a wrong glyph.
 */
const REPLACEMENTS: Readonly<Record<string, string>> = {
  '≤': '<=',
  '≥': '>=',
  '≈': '~',
  '→': '->',
  '←': '<-',
  '−': '-',
  '√': 'sqrt ',
  'θ': 'theta',
  'τ': 'tau',
  'Ω': 'ohm',
  '∫': 'integral ',
  '\u00a0': ' ',
  '\u202f': ' ',
  '\u2009': ' ',
};

/** The characters of Windows-1252 above 0x7F that are not Latin-1 (pdfkit's standard-font encoding). */
const WIN_ANSI_EXTRA = new Set('€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ');

/** `text` made safe for a PDF standard font: known symbols spelled out, unknown ones as "?". */
export function toWinAnsi(text: string): string {
  let out = '';
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if (code === 0x0a || (code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.has(ch)) {
      out += ch;
    } else {
      out += REPLACEMENTS[ch] ?? (code === 0x09 ? ' ' : '?');
    }
  }
  return out;
}
