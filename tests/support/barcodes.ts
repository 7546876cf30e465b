// Reads our barcode PNGs back with an independent decoder (@zxing/library, a port of ZXing),
// so tests compare what a scanner would see with the payload we meant to print.
import { PNG } from 'pngjs';
import { BarcodeFormat, BinaryBitmap, DecodeHintType, HybridBinarizer, MultiFormatReader, RGBLuminanceSource } from '@zxing/library';

export function decodePng(png: Buffer, { gs1 = false }: { gs1?: boolean } = {}) {
  const img = PNG.sync.read(png);
  // Pad with a white quiet zone: the decoder wants margin around the symbol.
  const pad = 40;
  const width = img.width + pad * 2;
  const height = img.height + pad * 2;
  const luminance = new Uint8ClampedArray(width * height).fill(255);
  for (let y = 0; y < img.height; y++)
    for (let x = 0; x < img.width; x++) {
      const i = (y * img.width + x) * 4;
      const a = img.data[i + 3]! / 255;
      const grey = (img.data[i]! * 0.299 + img.data[i + 1]! * 0.587 + img.data[i + 2]! * 0.114) * a + 255 * (1 - a);
      luminance[(y + pad) * width + x + pad] = grey;
    }
  const hints = new Map<DecodeHintType, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.CODE_128, BarcodeFormat.QR_CODE]],
    [DecodeHintType.TRY_HARDER, true],
  ]);
  if (gs1) hints.set(DecodeHintType.ASSUME_GS1, true);
  const source = new RGBLuminanceSource(luminance, width, height);
  // decode(image, hints) replaces the reader's hints, so they go in here.
  const result = new MultiFormatReader().decode(new BinaryBitmap(new HybridBinarizer(source)), hints);
  return { text: result.getText(), format: BarcodeFormat[result.getBarcodeFormat()] };
}
