// Text on our PDFs: the standard fonts' character set, wrapping and fitting to a width.
import type { PDFFont } from 'pdf-lib';

/** The standard PDF fonts speak WinAnsi only: spell out the few symbols they lack. */
export function winAnsi(text: string) {
  return text
    .replace(/≤/g, '<=')
    .replace(/≥/g, '>=')
    .replace(/→/g, '->')
    .replace(/≈/g, '~')
    .replace(/√/g, 'sqrt')
    .replace(/[‘’]/g, "'")
    .replace(/[“”]/g, '"')
    .replace(/[^\x20-\x7e\u00a0-\u00ff\u2013\u2014\u2022\u2026\u20ac]/g, '?');
}

/** Lines that fit `width`: words wrap, and a word wider than the line is broken, never cut off. */
export function wrapText(s: string, width: number, size: number, font: PDFFont) {
  const fits = (t: string) => font.widthOfTextAtSize(t, size) <= width;
  const words = winAnsi(s)
    .split(/\s+/)
    .filter(Boolean)
    .flatMap((w) => {
      if (fits(w)) return [w];
      const pieces: string[] = [];
      let piece = '';
      for (const ch of w) {
        if (piece && !fits(piece + ch)) {
          pieces.push(piece);
          piece = ch;
        } else piece += ch;
      }
      return piece ? [...pieces, piece] : pieces;
    });
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    const next = line ? `${line} ${w}` : w;
    if (!fits(next) && line) {
      lines.push(line);
      line = w;
    } else line = next;
  }
  if (line) lines.push(line);
  return lines;
}

/** One line that fits `width`: cut with an ellipsis when it is too long (for table cells). */
export function fitText(s: string, width: number, size: number, font: PDFFont) {
  let t = winAnsi(s);
  while (t.length > 1 && font.widthOfTextAtSize(t, size) > width) t = t.slice(0, -2) + '…';
  return t;
}
