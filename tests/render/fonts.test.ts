/**
 * textWidth measures word by word and remembers each word's width. Checked against fontkit's own layout of the whole
 * string (fontkit 2, the shaper pdfkit uses): for every pair of characters a pack's text uses, with one or two spaces
 * between them, the sum of the words equals the whole, in each face; and for longer mixed strings.
 */
import { describe, it, expect } from 'vitest';
import { fontFor, textWidth, type Face } from '../../src/render/fonts.js';

const CHARS = [...new Set("ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789.,;:!?()[]'\"-–—=+%<>/&*±×≥≤’“”ŵŷŁąïéèöüß€£\t".split(''))];

const whole = (text: string, size: number, face: Face): number => {
  const font = fontFor(face);
  return (font.layout(text).advanceWidth / font.unitsPerEm) * size;
};

describe('textWidth', () => {
  it('equals the whole string shaped at once for every pair of characters around a space, in each face', () => {
    for (const face of ['regular', 'bold', 'italic'] as const) {
      const bad: string[] = [];
      for (const a of CHARS) {
        for (const b of CHARS) {
          for (const gap of [' ', '  ']) {
            const s = `${a}${gap}${b}`;
            if (textWidth(s, 10, face) !== whole(s, 10, face)) bad.push(JSON.stringify(s));
          }
        }
      }
      expect(bad, face).toEqual([]);
    }
  });

  it('equals the whole string for labels, with leading and trailing spaces, and is 0 for nothing', () => {
    for (const s of ['Pant-yr-ŵyn, Tŷ Łąka 003 (n = 1,234)', ' 52% ', 'Agreeing (%)', 'Tŷ  Ŵern\tAVA', 'x']) {
      expect(textWidth(s, 9, 'regular')).toBeCloseTo(whole(s, 9, 'regular'), 12);
      expect(textWidth(s, 11, 'bold')).toBeCloseTo(whole(s, 11, 'bold'), 12);
    }
    expect(textWidth('Agreeing (%)', 10)).toBeGreaterThan(40);
    expect(textWidth('', 10)).toBe(0);
  });
});
