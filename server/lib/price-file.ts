// A supplier's price-list file → a header and rows of cells. The kind is decided by the bytes
// (a ZIP with an Excel workbook inside, or UTF-8 text), never by the file's name.
import { inflateRawSync } from 'node:zlib';
import Papa from 'papaparse';
import ExcelJS from 'exceljs';
import type { Cell } from '@shared/domain/price-list.ts';
import { AppError, ValidationError } from '../errors.ts';

export const PRICE_FILE_MAX_BYTES = 20 * 1024 * 1024;
export const PRICE_FILE_MAX_ROWS = 200_000;
/** Everything inside an XLSX, unpacked: a workbook of 200,000 rows is well under this. */
export const XLSX_MAX_UNPACKED_BYTES = 200 * 1024 * 1024;
const XLSX_MAX_ENTRIES = 2_000;

export type PriceFileKind = 'csv' | 'xlsx';

export interface PriceFile {
  kind: PriceFileKind;
  sheets: string[];
  sheet: string | null;
  columns: string[];
  /** Data rows (after the header), each with its row number as a spreadsheet shows it. */
  rows: { rowNo: number; cells: Cell[] }[];
}

const refuse = (message: string, code = 'bad_price_list') => new AppError(400, code, message);

/** What the bytes are. */
export function sniffPriceFile(bytes: Buffer): PriceFileKind {
  if (bytes.length === 0) throw refuse('The file is empty.', 'empty_file');
  if (bytes.length > PRICE_FILE_MAX_BYTES) throw new AppError(413, 'file_too_large', `Price lists can be at most ${PRICE_FILE_MAX_BYTES / 1024 / 1024} MB.`);
  if (bytes.subarray(0, 4).equals(Buffer.from([0x50, 0x4b, 0x03, 0x04]))) return 'xlsx';
  if (bytes.subarray(0, 4).equals(Buffer.from([0xd0, 0xcf, 0x11, 0xe0]))) throw refuse('This is an old Excel (.xls) workbook. Save it as .xlsx or CSV and upload that.', 'unsupported_file');
  const sample = bytes.subarray(0, 64 * 1024);
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes.length <= sample.length ? sample : trimToCharBoundary(sample));
  } catch {
    throw refuse('This file is neither a CSV (UTF-8 text) nor an XLSX workbook. Export the price list as CSV UTF-8 or XLSX.', 'unsupported_file');
  }
  // Text files have no control characters besides tab, CR and LF (a PDF or image in disguise has plenty).
  for (const b of sample) if (b === 0 || (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d)) throw refuse('This file is neither a CSV (UTF-8 text) nor an XLSX workbook. Export the price list as CSV UTF-8 or XLSX.', 'unsupported_file');
  return 'csv';
}

/** Cut a sample before a UTF-8 sequence the cut would split. */
function trimToCharBoundary(b: Buffer): Buffer {
  const end = b.length;
  for (let i = 1; i <= 3 && end - i >= 0; i++) {
    const byte = b[end - i]!;
    if ((byte & 0xc0) === 0xc0) return b.subarray(0, end - i); // lead byte of a sequence cut short
    if ((byte & 0xc0) !== 0x80) break;
  }
  return b;
}

/**
 * Reads a price list: CSV through papaparse (delimiter guessed, BOM dropped, RFC 4180 quoting),
 * XLSX through exceljs after the ZIP's real unpacked size is checked.
 */
export async function readPriceFile(bytes: Buffer, opts: { sheet?: string | null } = {}): Promise<PriceFile> {
  const kind = sniffPriceFile(bytes);
  const table = kind === 'csv' ? readCsv(bytes) : await readXlsx(bytes, opts.sheet ?? null);
  return { kind, ...table };
}

function readCsv(bytes: Buffer) {
  let textContent: string;
  try {
    textContent = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    throw refuse('The file is not UTF-8 text. Save it as "CSV UTF-8" and upload it again.', 'unsupported_file');
  }
  if (textContent.includes('\u0000')) throw refuse('The file holds characters that are not text.', 'unsupported_file');
  const parsed = Papa.parse<string[]>(textContent, { delimiter: '', delimitersToGuess: [',', ';', '\t', '|'], skipEmptyLines: 'greedy' });
  const quoteError = parsed.errors.find((e) => e.type === 'Quotes');
  if (quoteError) throw refuse(`Row ${(quoteError.row ?? 0) + 1}: ${quoteError.message.replace(/\.$/, '')} (a quoted field is never closed).`, 'bad_price_list');
  return tabulate(parsed.data.map((cells) => cells.map((c) => c as Cell)), null, [], 1);
}

/** Turns raw rows into a header and numbered data rows, refusing what cannot be a price list. */
function tabulate(raw: Cell[][], sheet: string | null, sheets: string[], firstRowNo: number, rowNos?: number[]) {
  const headerAt = raw.findIndex((r) => r.some((c) => c !== null && String(c).trim() !== ''));
  if (headerAt < 0) throw refuse(sheet ? `Sheet "${sheet}" is empty.` : 'The file has no rows.', 'empty_file');
  const seen = new Map<string, number>();
  const columns = raw[headerAt]!.map((c, i) => {
    const base = (c === null ? '' : String(c)).trim() || `Column ${i + 1}`;
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return n === 1 ? base : `${base} (${n})`;
  });
  const rows: PriceFile['rows'] = [];
  for (let i = headerAt + 1; i < raw.length; i++) {
    const cells = raw[i]!;
    if (!cells.some((c) => c !== null && String(c).trim() !== '')) continue;
    rows.push({ rowNo: rowNos ? rowNos[i]! : i + firstRowNo, cells });
  }
  if (rows.length === 0) throw refuse('The file has a header row but no price rows.', 'empty_file');
  if (rows.length > PRICE_FILE_MAX_ROWS) throw refuse(`The file has ${rows.length.toLocaleString('en-AU')} rows; a price list can have at most ${PRICE_FILE_MAX_ROWS.toLocaleString('en-AU')}. Split it and upload the parts.`, 'too_many_rows');
  return { columns, rows, sheet, sheets };
}

/**
 * A ZIP's entries unpacked one by one with a ceiling, so a small file that would unpack to
 * gigabytes (a "zip bomb") is refused before exceljs sees it. The sizes in the ZIP's own
 * directory may lie, so each entry is really inflated (and thrown away) under the limit.
 */
export function checkZipSize(bytes: Buffer, limit = XLSX_MAX_UNPACKED_BYTES) {
  const bad = () => refuse('This XLSX file is damaged (its ZIP directory cannot be read).', 'bad_price_list');
  let eocd = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 22 - 65_535); i--) {
    if (bytes.readUInt32LE(i) === 0x06054b50) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw bad();
  const entries = bytes.readUInt16LE(eocd + 10);
  let at = bytes.readUInt32LE(eocd + 16);
  if (entries > XLSX_MAX_ENTRIES) throw refuse('This XLSX file holds too many parts to be a price list.', 'file_too_large');
  let total = 0;
  for (let n = 0; n < entries; n++) {
    if (at + 46 > bytes.length || bytes.readUInt32LE(at) !== 0x02014b50) throw bad();
    const method = bytes.readUInt16LE(at + 10);
    const compressed = bytes.readUInt32LE(at + 20);
    const nameLen = bytes.readUInt16LE(at + 28);
    const extraLen = bytes.readUInt16LE(at + 30);
    const commentLen = bytes.readUInt16LE(at + 32);
    const local = bytes.readUInt32LE(at + 42);
    if (compressed === 0xffffffff || local === 0xffffffff) throw refuse('This XLSX file is too large to be a price list.', 'file_too_large');
    if (local + 30 > bytes.length || bytes.readUInt32LE(local) !== 0x04034b50) throw bad();
    const dataAt = local + 30 + bytes.readUInt16LE(local + 26) + bytes.readUInt16LE(local + 28);
    const data = bytes.subarray(dataAt, dataAt + compressed);
    let size: number;
    if (method === 0) size = data.length;
    else if (method === 8) {
      try {
        size = inflateRawSync(data, { maxOutputLength: Math.max(1, limit - total + 1) }).length;
      } catch (e) {
        if ((e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE' || e instanceof RangeError) throw tooBig(limit);
        throw bad();
      }
    } else throw refuse('This XLSX file uses a compression Stackyard does not read.', 'bad_price_list');
    total += size;
    if (total > limit) throw tooBig(limit);
    at += 46 + nameLen + extraLen + commentLen;
  }
}

const tooBig = (limit: number) => refuse(`This XLSX file unpacks to more than ${limit / 1024 / 1024} MB, far more than any price list; it is refused.`, 'file_too_large');

async function readXlsx(bytes: Buffer, wanted: string | null) {
  checkZipSize(bytes);
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.load(bytes as unknown as ArrayBuffer);
  } catch {
    throw refuse('This XLSX workbook cannot be read. Open it, save it again as .xlsx, and upload that.', 'bad_price_list');
  }
  const sheets = wb.worksheets.map((w) => w.name);
  if (sheets.length === 0) throw refuse('The workbook has no sheets.', 'empty_file');
  // Without a choice, the sheet with the most rows: notes and cover sheets are short.
  const ws = wanted ? wb.getWorksheet(wanted) : wb.worksheets.reduce((a, b) => (b.actualRowCount > a.actualRowCount ? b : a));
  if (!ws) throw new ValidationError(`The workbook has no sheet "${wanted}".`, { fields: [{ path: 'sheet', message: `Choose one of: ${sheets.join(', ')}.` }] });
  if (ws.rowCount > PRICE_FILE_MAX_ROWS + 1) throw refuse(`Sheet "${ws.name}" has ${ws.rowCount.toLocaleString('en-AU')} rows; a price list can have at most ${PRICE_FILE_MAX_ROWS.toLocaleString('en-AU')}.`, 'too_many_rows');
  const raw: Cell[][] = [];
  const rowNos: number[] = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNo) => {
    const cells: Cell[] = [];
    const count = Math.min(row.cellCount, 200);
    for (let c = 1; c <= count; c++) cells.push(cellValue(row.getCell(c).value));
    raw.push(cells);
    rowNos.push(rowNo);
  });
  return tabulate(raw, ws.name, sheets, 1, rowNos);
}

function cellValue(v: ExcelJS.CellValue): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return v;
  if (typeof v === 'string') return v;
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
  if (v instanceof Date) return v.toISOString().slice(0, 10);
  if (typeof v === 'object') {
    if ('richText' in v) return v.richText.map((r) => r.text).join('');
    if ('formula' in v || 'sharedFormula' in v) return cellValue((v as { result?: ExcelJS.CellValue }).result ?? null);
    if ('text' in v) return String((v as { text: unknown }).text);
    if ('error' in v) return null;
  }
  return null;
}
