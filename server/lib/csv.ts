import { cautionText } from "@shared/cautions";
import { stringify } from "csv-stringify/sync";

/** A spreadsheet would run a cell that starts like a formula; such cells are kept as text. */
export function asCell(value: unknown): string {
  const text = value === null || value === undefined ? "" : String(value);
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** A UTF-8 byte order mark first, so spreadsheets read accents and symbols correctly. */
export const csvPreamble = "\uFEFF";

/**
 * The standing caution as the file's last record, as wide as the header so a strict parser and a
 * spreadsheet read it as one more row: the header stays row one, and no comment syntax is needed,
 * which spreadsheets do not understand.
 */
export function cautionRow(columnCount: number): string {
  const row = [`Caution: ${cautionText}`, ...Array<string>(Math.max(columnCount - 1, 0)).fill("")];
  return stringify([row.map(asCell)]);
}
