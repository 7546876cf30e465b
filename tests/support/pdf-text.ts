import { createRequire } from 'node:module';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/** A PDF's text read back with pdfjs (an outside reader), and any text that runs off the page's right edge. */
export async function pdfText(buffer: Buffer): Promise<{ text: string; offPage: string[] }> {
  const fonts = `${createRequire(import.meta.url).resolve('pdfjs-dist/package.json').replace(/package\.json$/, '')}standard_fonts/`;
  const doc = await getDocument({ data: new Uint8Array(buffer), standardFontDataUrl: fonts, verbosity: 0 }).promise;
  const pages: string[] = [];
  const offPage: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const [, , right] = page.view;
    const content = await page.getTextContent();
    for (const item of content.items) {
      if ('str' in item && item.transform[4] + item.width > right) offPage.push(item.str);
    }
    pages.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' '));
  }
  return { text: pages.join(' ').replace(/\s+/g, ' '), offPage };
}
