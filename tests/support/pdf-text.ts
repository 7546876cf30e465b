// Reading our PDFs back in tests with an independent reader (pdf.js).
import { createRequire } from 'node:module';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/**
 * Every page's text, in reading order, with whitespace made single spaces, and the runs of
 * text that reach past the page's right edge (text drawn there is in the file but not seen).
 */
export async function pdfText(buffer: Buffer): Promise<{ text: string; offPage: string[]; pages: string[]; sizes: [number, number][] }> {
  const fonts = `${createRequire(import.meta.url).resolve('pdfjs-dist/package.json').replace(/package\.json$/, '')}standard_fonts/`;
  const doc = await getDocument({ data: new Uint8Array(buffer), standardFontDataUrl: fonts, verbosity: 0 }).promise;
  const pages: string[] = [];
  const offPage: string[] = [];
  const sizes: [number, number][] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const [, , right, top] = page.view;
    sizes.push([right, top]);
    const content = await page.getTextContent();
    for (const item of content.items) {
      if ('str' in item && item.transform[4] + item.width > right) offPage.push(item.str);
    }
    pages.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' '));
  }
  return { text: pages.join(' ').replace(/\s+/g, ' '), offPage, pages: pages.map((p) => p.replace(/\s+/g, ' ')), sizes };
}
