import { parse } from "csv-parse/sync";
import { expect } from "vitest";

import { cautionText } from "@shared/cautions";

/**
 * Reads an exported CSV the way a strict spreadsheet import would: every record as wide as the
 * header (the parser refuses ragged rows), the header first, the standing caution as the last row.
 */
export function readExport(text: string) {
  expect(text.startsWith("\uFEFF")).toBe(true);
  const records = parse(text, { bom: true }) as string[][];
  const [header, ...rest] = records;
  const caution = rest.pop();
  expect(caution?.[0]).toBe(`Caution: ${cautionText}`);
  expect(caution?.slice(1).every((cell) => cell === "")).toBe(true);
  // As objects keyed by the header, as an import by column name reads it.
  const objects = parse(text, { bom: true, columns: true }) as Record<string, string>[];
  expect(objects).toHaveLength(rest.length + 1);
  return { header: header!, rows: rest, objects: objects.slice(0, -1) };
}
