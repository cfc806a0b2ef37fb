import { createRequire } from "node:module";

import PDFDocument from "pdfkit";

import { cautionText } from "@shared/cautions";
import { itemCategoryLabels } from "@shared/checklists/categories";
import { formatInZone } from "@shared/calc/due";
import { rulesVersion, severityLabels } from "@shared/calc/verdict";
import { actionStateLabels } from "@shared/workflow/action-workflow";
import type { ComparisonResponse, Proportion, TrendsResponse } from "@shared/schemas/committee";
import type { CommitteePressureResponse } from "@shared/schemas/committee-pressure";
import type { ObservationCommitteeResponse } from "@shared/schemas/observations";
import { zoneTypeLabels } from "@shared/zones";

import type { overdueActions } from "./committee.repository";
import { networkLabel } from "./observations.csv";
import { pressureSection } from "./pressure.report";

const require = createRequire(import.meta.url);
const fonts = {
  regular: require.resolve("@fontsource/noto-sans/files/noto-sans-latin-400-normal.woff"),
  bold: require.resolve("@fontsource/noto-sans/files/noto-sans-latin-700-normal.woff"),
};

export type OverdueRow = Awaited<ReturnType<typeof overdueActions>>[number];

export interface ReportInput {
  comparison: ComparisonResponse;
  trends: TrendsResponse;
  overdue: OverdueRow[];
  /** The observation figures; the section is left out when not given. */
  observations?: ObservationCommitteeResponse;
  /** The room-pressure figures, on a page of their own; left out when not given. */
  pressure?: CommitteePressureResponse;
  generatedAt: Date;
}

const ink = "#17212b";
const muted = "#4a5866";
const brand = "#1f5c5f";
const warn = "#a4372b";
const percent = (value: number | null | undefined) =>
  value === null || value === undefined ? "–" : `${(value * 100).toFixed(1)}%`;

/** The monthly committee report, with Noto Sans embedded. Resolves with the PDF's bytes. */
export function buildMonthlyReport(input: ReportInput): Promise<Buffer> {
  const { comparison, trends } = input;
  const doc = new PDFDocument({
    size: "A4",
    margin: 48,
    info: {
      Title: `${comparison.networkName}: infection prevention readiness, ${comparison.from} to ${comparison.to}`,
      Author: "Lintel",
      Subject: "Committee report",
    },
  });
  doc.registerFont("body", fonts.regular);
  doc.registerFont("bold", fonts.bold);
  const chunks: Buffer[] = [];
  doc.on("data", (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
  const left = doc.page.margins.left;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const heading = (text: string) => {
    if (doc.y > doc.page.height - 160) doc.addPage();
    doc.moveDown(0.8).font("bold").fontSize(14).fillColor(brand).text(text, left);
    doc.moveDown(0.3).font("body").fontSize(10).fillColor(ink);
  };
  /** A short paragraph kept whole: it starts the next page rather than leave a line or two behind. */
  const paragraph = (text: string, size: number, color: string) => {
    doc.font("body").fontSize(size).fillColor(color);
    if (doc.y + doc.heightOfString(text, { width }) > bottom()) doc.addPage();
    doc.text(text, left, doc.y, { width });
  };
  const table = (columns: string[], rows: string[][]) =>
    drawTable(doc, { left, width, bottom }, columns, rows);

  // Title and scope.
  doc.font("bold").fontSize(20).fillColor(brand).text(comparison.networkName);
  doc
    .font("body")
    .fontSize(12)
    .fillColor(ink)
    .text(
      `Infection prevention committee report: isolation and PPE spaces, ${comparison.from} to ${comparison.to}`,
    );
  doc
    .fontSize(9)
    .fillColor(muted)
    .text(
      `${comparison.zoneType ? zoneTypeLabels[comparison.zoneType] : "All zone types"} · generated ${input.generatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC by Lintel`,
    );
  doc.moveDown(0.6).fontSize(9).fillColor(warn).text(cautionText, { width });

  heading("Readiness by site");
  paragraph(
    `Share of submitted audits with an "All clear" verdict, with 95% Wilson score intervals (Newcombe 1998). Sites with fewer than ${comparison.minimumRankedSample} audits are flagged and not ranked. Network: ${percent(comparison.network.rate)} of ${comparison.network.n} audits. Under the readiness rules version ${rulesVersion}, an isolation room is put on "Hold until fixed" unless inward airflow was confirmed in the audit (a pressure reading meeting the threshold or a passing visual test); each audit's page gives the reasons for its verdict.`,
    9,
    muted,
  );
  doc.moveDown(0.4);
  table(
    ["Rank", "Site", "Audits", "All clear", "95% interval", "Note"],
    comparison.sites.map((site) => [
      site.rank ? String(site.rank) : "–",
      site.siteName,
      String(site.readiness.n),
      percent(site.readiness.rate),
      site.readiness.interval
        ? `${percent(site.readiness.interval.lower)} – ${percent(site.readiness.interval.upper)}`
        : "–",
      site.readiness.smallSample ? "Small sample: not ranked" : "",
    ]),
  );
  if (comparison.difference) {
    const a = comparison.sites.find((s) => s.siteId === comparison.difference!.siteA)!;
    const b = comparison.sites.find((s) => s.siteId === comparison.difference!.siteB)!;
    const d = comparison.difference;
    doc.moveDown(0.4);
    paragraph(
      `${a.siteName} minus ${b.siteName}: ${percent(d.difference)} (95% interval ${percent(d.interval.lower)} to ${percent(d.interval.upper)}, Newcombe's hybrid score method). ${d.excludesZero ? "The interval leaves out zero: the difference is unlikely to be chance." : "The interval includes zero: the difference may be chance."}`,
      9,
      ink,
    );
  }

  heading("Compliance by item group");
  const categories = [
    ...new Set(comparison.sites.flatMap((s) => s.categories.map((c) => c.category))),
  ];
  table(
    ["Site", ...categories.map((category) => itemCategoryLabels[category])],
    comparison.sites.map((site) => [
      site.siteName,
      ...categories.map((category) => {
        const c = site.categories.find((entry) => entry.category === category);
        return c
          ? `${percent(c.rate)} (${percent(c.interval?.lower)}–${percent(c.interval?.upper)})`
          : "–";
      }),
    ]),
  );

  heading("Monthly readiness (p-chart, 3-sigma limits)");
  paragraph(
    "Dots: monthly share of audits with an \"All clear\" verdict; line: the site's centre; band: 3-sigma limits for each month's number of audits. Red dots lie outside the limits, and the months outside are listed under each chart. Months without audits are left out.",
    9,
    muted,
  );
  for (const site of trends.sites) {
    if (site.points.length === 0) continue;
    if (doc.y > doc.page.height - 190) doc.addPage();
    doc.moveDown(0.5).font("bold").fontSize(10).fillColor(ink).text(site.siteName, left);
    const top = doc.y + 4;
    const chartHeight = 110;
    const chartWidth = width - 40;
    const x0 = left + 32;
    const step = site.points.length > 1 ? chartWidth / (site.points.length - 1) : 0;
    const yOf = (p: number) => top + chartHeight * (1 - p);
    doc.lineWidth(0.5).strokeColor("#c9d1d8").rect(x0, top, chartWidth, chartHeight).stroke();
    doc.font("body").fontSize(7).fillColor(muted);
    for (const tick of [0, 0.5, 1])
      doc.text(`${tick * 100}%`, left, yOf(tick) - 4, { width: 28, align: "right" });
    // The limits as a band, month by month.
    site.points.forEach((point, index) => {
      const x = x0 + index * step;
      doc
        .rect(x - 3, yOf(point.upper), 6, Math.max(0.5, yOf(point.lower) - yOf(point.upper)))
        .fillColor("#dde9ea")
        .fill();
    });
    if (site.centre !== null) {
      doc
        .moveTo(x0, yOf(site.centre))
        .lineTo(x0 + chartWidth, yOf(site.centre))
        .strokeColor(brand)
        .lineWidth(1)
        .stroke();
    }
    site.points.forEach((point, index) => {
      const x = x0 + index * step;
      doc
        .circle(x, yOf(point.p), 2.5)
        .fillColor(point.outside ? warn : ink)
        .fill();
    });
    doc.font("body").fontSize(7).fillColor(muted);
    const first = site.points[0]!.month;
    const last = site.points.at(-1)!.month;
    doc.text(first, x0 - 10, top + chartHeight + 3, { lineBreak: false });
    doc.text(last, x0 + chartWidth - 30, top + chartHeight + 3, { lineBreak: false });
    doc.x = left;
    doc.y = top + chartHeight + 16;
    const outside = site.points.filter((p) => p.outside).map((p) => p.month);
    paragraph(
      `Centre ${percent(site.centre)}. ${outside.length > 0 ? `Outside the limits: ${outside.join(", ")}.` : "No month outside the limits."}`,
      8,
      ink,
    );
  }

  heading("Corrective actions not yet done: days since raised");
  table(
    ["Site", "0–7 days", "8–30 days", "31–90 days", "Over 90 days", "Overdue (all)"],
    trends.aging.map((row) => [
      row.siteName,
      String(row.unfinished["0-7"]),
      String(row.unfinished["8-30"]),
      String(row.unfinished["31-90"]),
      String(row.unfinished["90+"]),
      String(Object.values(row.overdue).reduce((sum, n) => sum + n, 0)),
    ]),
  );

  heading("Median days to Done (fixes confirmed in the period)");
  table(
    ["Site", "Severity", "Done", "Median days"],
    trends.closeTimes.map((row) => [
      row.siteName,
      severityLabels[row.severity],
      String(row.closed),
      row.medianDays.toFixed(1),
    ]),
  );

  heading("Overdue corrective actions");
  if (input.overdue.length === 0) paragraph("None.", 10, ink);
  else
    table(
      ["Site", "Space", "Finding", "Severity", "State", "Due (site time)", "Owner"],
      input.overdue.map((row) => [
        row.site_name,
        row.space_name,
        row.title,
        severityLabels[row.severity],
        actionStateLabels[row.state],
        formatInZone(row.due_at, row.time_zone),
        row.owner ?? "No owner",
      ]),
    );

  if (input.observations) observationSection(input.observations, { heading, paragraph, table });
  if (input.pressure)
    pressureSection(
      input.pressure,
      { addPage: () => doc.addPage(), heading, paragraph, table },
      { ink, muted },
    );

  doc.moveDown(1);
  paragraph(cautionText, 8, warn);
  doc.end();
  return done;
}

const withInterval = (p: Proportion) =>
  p.rate === null
    ? "–"
    : `${percent(p.rate)} of ${p.n} (${percent(p.interval?.lower)}–${percent(p.interval?.upper)})${p.smallSample ? ", small sample" : ""}`;

/** Observed putting-on and removal: per site, then the most error-prone steps. No staff codes. */
function observationSection(
  figures: ObservationCommitteeResponse,
  draw: {
    heading: (text: string) => void;
    paragraph: (text: string, size: number, color: string) => void;
    table: (columns: string[], rows: string[][]) => void;
  },
) {
  draw.heading("Observed putting-on and removal");
  draw.paragraph(
    `Each observation counts once per step, however many breaches that step had. Rates carry 95% Wilson score intervals; fewer than ${figures.minimumRankedSample} observations is a small sample, and steps are ranked only from ${figures.minimumRankedSample}. Hand hygiene: the share of observations with every moment performed (with its interval), and beside it the share of all moments performed (no interval: moments in one observation are not independent). Clean after coaching: staff coached and observed again whose next observation had no breach. Figures describing fewer than ${figures.minimumStaffCodes} staff members are withheld.`,
    9,
    muted,
  );
  const all = [...figures.sites, { siteName: networkLabel, ...figures.network }];
  draw.table(
    ["Site", "Observations", "Every hand-hygiene moment", "Moments", "Clean after coaching"],
    all.map((site) =>
      site.suppressed
        ? [site.siteName, String(site.observations), "Withheld: fewer than 5 staff", "–", "–"]
        : [
            site.siteName,
            String(site.observations),
            site.handHygieneAllMoments.suppressed
              ? "Withheld"
              : withInterval(site.handHygieneAllMoments),
            percent(site.handHygieneMomentRate),
            site.cleanAfterCoaching.suppressed
              ? "Withheld: fewer than 5 staff"
              : withInterval(site.cleanAfterCoaching),
          ],
    ),
  );
  draw.heading("Most error-prone steps");
  const ranked = all.flatMap((site) =>
    site.mostErrorProne.map((step, index) => [
      site.siteName,
      String(index + 1),
      step.sequenceTitle,
      step.stepText,
      withInterval(step.breached),
    ]),
  );
  if (ranked.length === 0)
    draw.paragraph(
      `No step has ${figures.minimumRankedSample} or more observations with a breach in the period.`,
      10,
      ink,
    );
  else draw.table(["Site", "Rank", "Sequence", "Step", "Breached (95% interval)"], ranked);
}

const cellGap = 6;
const rowGap = 3;
const cellSize = 9;

/**
 * Column widths that add up to the width between the margins: shares in proportion to each
 * column's text on one line, but never narrower than its longest word (up to a fifth of the page),
 * so a long value wraps at spaces and hyphens rather than inside a word.
 */
function columnWidths(doc: PDFKit.PDFDocument, table: string[][], width: number): number[] {
  const count = table[0]!.length;
  const measure = (text: string, bold: boolean) =>
    doc
      .font(bold ? "bold" : "body")
      .fontSize(cellSize)
      .widthOfString(text) + cellGap;
  const least = Array.from({ length: count }, () => cellGap);
  const natural = Array.from({ length: count }, () => cellGap);
  table.forEach((cells, row) =>
    cells.forEach((cell, column) => {
      const words = cell.split(/\s+|(?<=-)/).map((word) => measure(word, row === 0));
      least[column] = Math.min(width / 5, Math.max(least[column]!, ...words));
      natural[column] = Math.max(natural[column]!, measure(cell, row === 0));
    }),
  );
  const leastTotal = least.reduce((total, value) => total + value, 0);
  if (leastTotal >= width) return least.map((value) => (value / leastTotal) * width);
  // Pin the columns whose share would fall below their longest word; share the rest again.
  const pinned = new Set<number>();
  for (;;) {
    const free = natural.filter((_, column) => !pinned.has(column));
    const room = width - [...pinned].reduce((total, column) => total + least[column]!, 0);
    const scale = room / free.reduce((total, value) => total + value, 0);
    const widths = natural.map((value, column) =>
      pinned.has(column) ? least[column]! : value * scale,
    );
    const short = widths.findIndex(
      (value, column) => !pinned.has(column) && value < least[column]!,
    );
    if (short === -1 || pinned.size === count - 1) return widths;
    pinned.add(short);
  }
}

/**
 * A table drawn row by row: each row is measured first and drawn whole at one height, on the next
 * page under a repeated header when it does not fit; long values wrap inside their column (a word
 * wider than its column breaks within the word), so nothing runs past the margins.
 */
function drawTable(
  doc: PDFKit.PDFDocument,
  area: { left: number; width: number; bottom: () => number },
  header: string[],
  rows: string[][],
) {
  const widths = columnWidths(doc, [header, ...rows], area.width);
  const style = (bold: boolean) =>
    doc
      .font(bold ? "bold" : "body")
      .fontSize(cellSize)
      .fillColor(ink);
  const heightOf = (cells: string[], bold: boolean) => {
    style(bold);
    return Math.max(
      ...cells.map((cell, index) =>
        cell === "" ? 0 : doc.heightOfString(cell, { width: widths[index]! - cellGap }),
      ),
    );
  };
  const draw = (cells: string[], bold: boolean, height: number) => {
    const y = doc.y;
    let x = area.left;
    style(bold);
    cells.forEach((cell, index) => {
      const cellWidth = widths[index]! - cellGap;
      // The height bound keeps pdfkit from ever flowing a cell onto a page of its own.
      if (cell !== "") doc.text(cell, x, y, { width: cellWidth, height: height + 1 });
      x += widths[index]!;
    });
    doc.x = area.left;
    doc.y = y + height + rowGap;
  };
  const headerHeight = heightOf(header, true);
  const drawHeader = () => {
    draw(header, true, headerHeight);
    doc
      .moveTo(area.left, doc.y - 1)
      .lineTo(area.left + area.width, doc.y - 1)
      .strokeColor(muted)
      .lineWidth(0.5)
      .stroke();
  };
  const firstHeight = rows.length > 0 ? heightOf(rows[0]!, false) : 0;
  if (doc.y + headerHeight + rowGap + firstHeight > area.bottom()) doc.addPage();
  drawHeader();
  for (const row of rows) {
    const height = heightOf(row, false);
    if (doc.y + height > area.bottom()) {
      doc.addPage();
      drawHeader();
    }
    draw(row, false, height);
  }
}
