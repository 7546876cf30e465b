import type { Response } from 'express';
import Papa from 'papaparse';
import { neutraliseRow } from '@shared/domain/csv-safety.ts';

/** A CSV download: RFC 4180 via papaparse, UTF-8 with a BOM for spreadsheets, formula injection neutralised. */
export function sendCsv(res: Response, rows: Record<string, unknown>[], fileName: string) {
  const csv = Papa.unparse(rows.map(neutraliseRow));
  res.setHeader('content-type', 'text/csv; charset=utf-8');
  res.setHeader('content-disposition', `attachment; filename="${fileName}.csv"`);
  res.send(`\uFEFF${csv}\r\n`);
}
