import { parse as parseCsv } from "csv-parse/sync";
import type { z } from "zod";

import {
  maxBatchReadings,
  pressureReadingSchema,
  problemsOf,
  type PressureReading,
  type ReadingProblem,
} from "./pressure-readings";

/**
 * The CSV upload of pressure readings, for buildings without a broker. Server side only: the CSV
 * parser needs Node's Buffer, so the client imports `pressure-readings.ts`, never this file.
 */

/** The CSV columns, in this order in the template; the header may spell them monitorId etc. */
export const csvColumns = ["monitor_id", "measured_at", "pressure", "unit", "door"] as const;
type CsvColumn = (typeof csvColumns)[number];
const requiredCsvColumns: readonly CsvColumn[] = ["monitor_id", "measured_at", "pressure", "unit"];

const fieldOfColumn: Record<CsvColumn, keyof z.input<typeof pressureReadingSchema>> = {
  monitor_id: "monitorId",
  measured_at: "measuredAt",
  pressure: "pressure",
  unit: "unit",
  door: "door",
};
const columnOfField = Object.fromEntries(
  Object.entries(fieldOfColumn).map(([column, field]) => [field, column]),
) as Record<string, CsvColumn>;

/** A bad CSV row: its line in the file (1 = the header) and the column at fault. */
export interface CsvRowProblem extends ReadingProblem {
  line: number;
}

export interface CsvBatch {
  readings: PressureReading[];
  problems: CsvRowProblem[];
}

const headerKey = (cell: string) =>
  cell
    .trim()
    .toLowerCase()
    .replace(/[\s_-]/g, "");
const columnByHeaderKey = new Map(csvColumns.map((column) => [headerKey(column), column]));

const decimalComma = Symbol("decimal comma");

// A decimal number as a spreadsheet writes it, with a point: -3.1, .5, 1e-2.
const decimal = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function cellValue(column: CsvColumn, cell: string): unknown {
  const value = cell.trim();
  if (column === "door") return value === "" ? null : value;
  if (column === "pressure") {
    if (value === "") return undefined;
    if (decimal.test(value)) return Number(value);
    return /^[+-]?\d+,\d+$/.test(value) ? decimalComma : value;
  }
  return value === "" ? undefined : value;
}

/**
 * Parses a CSV batch: a header row naming the columns (monitor_id, measured_at, pressure, unit,
 * optional door; any order), then one reading a row. Every bad row is reported by its line and
 * column, with the rows that are good; the caller decides whether a batch with problems is kept.
 */
export function parsePressureCsv(csv: string): CsvBatch {
  // One line break, so the parser's line count is the line a person sees in an editor.
  const normalised = csv.replace(/\r\n?/g, "\n");
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parseCsv(normalised, {
      bom: true,
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      max_record_size: 10_000,
    }) as unknown as typeof records;
  } catch (error) {
    const line = (error as { lines?: number }).lines ?? 1;
    const reason = error instanceof Error ? error.message.split(":")[0] : "Unreadable CSV";
    return {
      readings: [],
      problems: [{ line, field: "file", message: `Not readable as CSV (${reason}).` }],
    };
  }
  // The line a record starts on: its last line less the line breaks inside quoted cells.
  const startLine = (entry: (typeof records)[number]) =>
    entry.info.lines - entry.record.reduce((sum, cell) => sum + (cell.split("\n").length - 1), 0);

  const [header, ...rows] = records;
  if (!header)
    return { readings: [], problems: [{ line: 1, field: "file", message: "The file is empty." }] };
  const headerLine = startLine(header);
  const problems: CsvRowProblem[] = [];
  const columns: (CsvColumn | null)[] = header.record.map((cell) => {
    const column = columnByHeaderKey.get(headerKey(cell)) ?? null;
    if (column === null)
      problems.push({
        line: headerLine,
        field: cell.trim() || "(blank)",
        message: `Unknown column; use ${csvColumns.join(", ")}.`,
      });
    return column;
  });
  for (const column of requiredCsvColumns) {
    if (!columns.includes(column))
      problems.push({ line: headerLine, field: column, message: "Missing column." });
  }
  for (const column of csvColumns) {
    if (columns.filter((named) => named === column).length > 1)
      problems.push({ line: headerLine, field: column, message: "Named twice in the header." });
  }
  if (problems.length > 0) return { readings: [], problems };
  if (rows.length > maxBatchReadings)
    return {
      readings: [],
      problems: [
        {
          line: startLine(rows[maxBatchReadings]!),
          field: "file",
          message: `At most ${maxBatchReadings.toLocaleString("en-US")} readings in one upload.`,
        },
      ],
    };

  const readings: PressureReading[] = [];
  for (const row of rows) {
    const line = startLine(row);
    if (row.record.length !== columns.length) {
      problems.push({
        line,
        field: "row",
        message: `${row.record.length} cells where the header has ${columns.length}.`,
      });
      continue;
    }
    const input: Record<string, unknown> = {};
    columns.forEach((column, index) => {
      input[fieldOfColumn[column!]] = cellValue(column!, row.record[index]!);
    });
    const parsed = pressureReadingSchema.safeParse(input);
    if (parsed.success) {
      readings.push(parsed.data);
      continue;
    }
    for (const problem of problemsOf(parsed.error, (key) => columnOfField[key] ?? key)) {
      // "-3,1" is a decimal comma, not text: say so rather than "must be a number".
      const message =
        problem.field === "pressure" && input.pressure === decimalComma
          ? "Use a point for decimals, such as -3.1."
          : problem.message;
      problems.push({ line, field: problem.field, message });
    }
  }
  return { readings, problems };
}
