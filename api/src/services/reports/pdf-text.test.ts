import { describe, expect, it } from 'vitest';
import { toWinAnsi } from './pdf-text.js';

describe('toWinAnsi', () => {
  it('when text has symbols outside Windows-1252, then they are spelled out; Latin-1 and typographic marks stay', () => {
    // source: Windows-1252 code page (0x80–0x9F typographic marks, 0xA0–0xFF Latin-1), the encoding of the PDF standard fonts
    expect(toWinAnsi('I ≤ 16 A × 1.25 – maker’s curve, 30 °C, I²t')).toBe('I <= 16 A × 1.25 – maker’s curve, 30 °C, I²t');
    expect(toWinAnsi('≈ 6 × FLC → trip; 漢')).toBe('~ 6 × FLC -> trip; ?');
    expect(toWinAnsi('a\tb\nc')).toBe('a b\nc');
  });
});
