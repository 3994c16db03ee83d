// Tables as CSV for a spreadsheet. Text we did not write ourselves (part numbers, descriptions,
// family codes and names, supplier names) goes through the formula-injection guard; figures we
// computed go out as plain numbers, minus signs and all.
import { stringify } from 'csv-stringify/sync';
import type { Response } from 'express';
import { neutralizeCell } from '../../shared/csv-safety';

export type CsvCell = string | number | null | undefined;

export interface CsvColumn<T> {
  header: string;
  /** Text from people or suppliers: neutralized. */
  text?: (row: T) => string | null | undefined;
  /** A figure, a date or an id we wrote ourselves: written as is. */
  value?: (row: T) => CsvCell;
}

export interface CsvTable<T> {
  /** File name without extension, e.g. "sales-2026-01-01-to-2026-12-31". */
  name: string;
  columns: CsvColumn<T>[];
  rows: readonly T[];
}

export function toCsv<T>(table: CsvTable<T>): string {
  const header = table.columns.map((c) => neutralizeCell(c.header));
  const body = table.rows.map((row) =>
    table.columns.map((c) => {
      if (c.text) {
        const text = c.text(row);
        return text === null || text === undefined ? '' : neutralizeCell(text);
      }
      const value = c.value ? c.value(row) : '';
      return value === null || value === undefined ? '' : String(value);
    }),
  );
  // A byte-order mark so spreadsheets open the file as UTF-8 (µ, ø and – in descriptions).
  return stringify([header, ...body], { bom: true, record_delimiter: '\r\n' });
}

/** Sends the table as a download named stepstock-<name>.csv. */
export function sendCsv<T>(res: Response, table: CsvTable<T>): void {
  const file = `stepstock-${table.name.replace(/[^A-Za-z0-9._-]/g, '-')}.csv`;
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${file}"`);
  res.status(200).send(toCsv(table));
}
