import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

/** One run of text as the PDF places it, in points from the page's top-left corner. */
export interface PlacedText {
  text: string;
  /** Left edge. */
  x: number;
  /** Right edge. */
  right: number;
  /** Baseline, measured down from the top of the page. */
  y: number;
}

export interface PdfPage {
  number: number;
  width: number;
  height: number;
  items: PlacedText[];
}

/** The text of each page with where it stands, read by the same parser that browsers use. */
export async function readPdfLayout(bytes: Buffer): Promise<PdfPage[]> {
  const document = await getDocument({
    data: new Uint8Array(bytes),
    useSystemFonts: false,
    isEvalSupported: false,
    verbosity: 0,
  }).promise;
  const pages: PdfPage[] = [];
  for (let number = 1; number <= document.numPages; number += 1) {
    const page = await document.getPage(number);
    const { width, height } = page.getViewport({ scale: 1 });
    const content = await page.getTextContent();
    const items: PlacedText[] = [];
    for (const item of content.items) {
      if (!("str" in item) || item.str.trim() === "") continue;
      const [, , , , x, baseline] = item.transform as number[];
      items.push({ text: item.str, x: x!, right: x! + item.width, y: height - baseline! });
    }
    pages.push({ number, width, height, items });
  }
  await document.destroy();
  return pages;
}

/** The distinct baselines on a page: its lines of text. */
export function linesOf(page: PdfPage): number[] {
  const ys = [...new Set(page.items.map((item) => Math.round(item.y)))].sort((a, b) => a - b);
  return ys.filter((y, index) => index === 0 || y - ys[index - 1]! > 1);
}

const squash = (text: string) => text.replace(/\s+/g, "");

interface Column {
  label: string;
  x: number;
}

/**
 * Where a table's header stands on a page (its labels side by side, starting on one line; a label
 * may wrap inside its column), if it does.
 */
export function headerOn(
  page: PdfPage,
  labels: readonly string[],
): { y: number; columns: Column[] } | null {
  const starts = (item: PlacedText, label: string) =>
    item.text.trim() !== "" && label.startsWith(item.text.trim());
  for (const first of page.items.filter((item) => starts(item, labels[0]!))) {
    const columns: Column[] = [{ label: labels[0]!, x: first.x }];
    for (const label of labels.slice(1)) {
      const match = page.items.find(
        (item) =>
          Math.abs(item.y - first.y) < 1 && starts(item, label) && item.x > columns.at(-1)!.x,
      );
      if (!match) break;
      columns.push({ label, x: match.x });
    }
    if (columns.length === labels.length) return { y: first.y, columns };
  }
  return null;
}

/**
 * Finds a table row on a page below that page's copy of the header: every cell's text read top to
 * bottom inside its column, all cells starting on the same line. Null when the row is not whole
 * on this page (a cell split onto another page, or missing).
 */
export function rowOn(
  page: PdfPage,
  labels: readonly string[],
  cells: readonly string[],
): { y: number } | null {
  const header = headerOn(page, labels);
  if (!header) return null;
  const bounds = header.columns.map((column, index) => ({
    from: column.x - 0.5,
    to: header.columns[index + 1]?.x ?? page.width,
  }));
  const lines = [
    ...new Set(page.items.filter((i) => i.y > header.y + 1).map((i) => Math.round(i.y * 10) / 10)),
  ].sort((a, b) => a - b);
  const textAt = (y: number, column: number) =>
    page.items
      .filter(
        (item) =>
          Math.abs(item.y - y) < 0.2 &&
          item.x >= bounds[column]!.from &&
          item.x < bounds[column]!.to,
      )
      .sort((a, b) => a.x - b.x)
      .map((item) => item.text)
      .join("");
  const wanted = cells.map(squash);
  for (let start = 0; start < lines.length; start += 1) {
    const whole = wanted.every((cell, column) => {
      if (cell === "") return true;
      let read = "";
      for (let line = start; line < lines.length; line += 1) {
        const piece = squash(textAt(lines[line]!, column));
        if (line === start && piece === "") return false;
        if (piece === "") continue;
        if (!cell.startsWith(read + piece)) return false;
        read += piece;
        if (read === cell) return true;
      }
      return false;
    });
    if (whole) return { y: lines[start]! };
  }
  return null;
}
