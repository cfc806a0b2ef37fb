/** A spreadsheet would run a cell that starts like a formula; such cells are kept as text. */
export function asCell(value: unknown): string {
  const text = value === null || value === undefined ? "" : String(value);
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/** A UTF-8 byte order mark first, so spreadsheets read accents and symbols correctly. */
export const csvPreamble = "\uFEFF";
