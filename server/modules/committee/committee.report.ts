import { createRequire } from "node:module";

import PDFDocument from "pdfkit";

import { cautionText } from "@shared/cautions";
import { itemCategoryLabels } from "@shared/checklists/categories";
import { formatInZone } from "@shared/calc/due";
import { rulesVersion } from "@shared/calc/verdict";
import type { ComparisonResponse, TrendsResponse } from "@shared/schemas/committee";
import { zoneTypeLabels } from "@shared/zones";

import type { overdueActions } from "./committee.repository";

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
  const heading = (text: string) => {
    if (doc.y > doc.page.height - 160) doc.addPage();
    doc.moveDown(0.8).font("bold").fontSize(14).fillColor(brand).text(text, left);
    doc.moveDown(0.3).font("body").fontSize(10).fillColor(ink);
  };
  const table = (columns: { label: string; width: number }[], rows: string[][]) => {
    const line = (cells: string[], bold: boolean) => {
      if (doc.y > doc.page.height - 72) doc.addPage();
      const y = doc.y;
      let x = left;
      let height = 0;
      cells.forEach((cell, index) => {
        doc
          .font(bold ? "bold" : "body")
          .fontSize(9)
          .fillColor(ink);
        doc.text(cell, x, y, { width: columns[index]!.width - 6 });
        height = Math.max(height, doc.y - y);
        x += columns[index]!.width;
      });
      doc.y = y + height + 3;
      doc.x = left;
    };
    line(
      columns.map((c) => c.label),
      true,
    );
    doc
      .moveTo(left, doc.y - 1)
      .lineTo(left + width, doc.y - 1)
      .strokeColor(muted)
      .lineWidth(0.5)
      .stroke();
    for (const row of rows) line(row, false);
  };

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
  doc
    .fontSize(9)
    .fillColor(muted)
    .text(
      `Share of submitted audits with a "ready" verdict, with 95% Wilson score intervals (Newcombe 1998). Sites with fewer than ${comparison.minimumRankedSample} audits are flagged and not ranked. Network: ${percent(comparison.network.rate)} of ${comparison.network.n} audits. Under the readiness rules version ${rulesVersion}, an isolation room is "not ready" unless inward airflow was confirmed in the audit (a pressure reading meeting the threshold or a passing visual test); each audit's page gives the reasons for its verdict.`,
      { width },
    );
  doc.moveDown(0.4).fillColor(ink);
  table(
    [
      { label: "Rank", width: 40 },
      { label: "Site", width: 170 },
      { label: "Audits", width: 55 },
      { label: "Ready", width: 60 },
      { label: "95% interval", width: 110 },
      { label: "Note", width: width - 435 },
    ],
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
    doc
      .moveDown(0.4)
      .fontSize(9)
      .text(
        `${a.siteName} minus ${b.siteName}: ${percent(d.difference)} (95% interval ${percent(d.interval.lower)} to ${percent(d.interval.upper)}, Newcombe's hybrid score method). ${d.excludesZero ? "The interval leaves out zero: the difference is unlikely to be chance." : "The interval includes zero: the difference may be chance."}`,
        { width },
      );
  }

  heading("Compliance by item group");
  const categories = [
    ...new Set(comparison.sites.flatMap((s) => s.categories.map((c) => c.category))),
  ];
  table(
    [
      { label: "Site", width: 150 },
      ...categories.map((category) => ({
        label: itemCategoryLabels[category],
        width: (width - 150) / Math.max(1, categories.length),
      })),
    ],
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
  doc
    .fontSize(9)
    .fillColor(muted)
    .text(
      "Dots: monthly share of audits ready; line: the site's centre; band: 3-sigma limits for each month's number of audits. Red dots lie outside the limits. Months without audits are left out.",
      { width },
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
    doc
      .fontSize(8)
      .fillColor(ink)
      .text(
        `Centre ${percent(site.centre)}. ${outside.length > 0 ? `Outside the limits: ${outside.join(", ")}.` : "No month outside the limits."}`,
        left,
      );
  }

  heading("Corrective actions: age of open work");
  table(
    [
      { label: "Site", width: 170 },
      { label: "Open 0–7 d", width: 70 },
      { label: "8–30 d", width: 55 },
      { label: "31–90 d", width: 55 },
      { label: "> 90 d", width: 55 },
      { label: "Overdue (all)", width: width - 405 },
    ],
    trends.aging.map((row) => [
      row.siteName,
      String(row.open["0-7"]),
      String(row.open["8-30"]),
      String(row.open["31-90"]),
      String(row.open["90+"]),
      String(Object.values(row.overdue).reduce((sum, n) => sum + n, 0)),
    ]),
  );

  heading("Median days to close (actions closed in the period)");
  table(
    [
      { label: "Site", width: 200 },
      { label: "Severity", width: 90 },
      { label: "Closed", width: 80 },
      { label: "Median days", width: width - 370 },
    ],
    trends.closeTimes.map((row) => [
      row.siteName,
      row.severity,
      String(row.closed),
      row.medianDays.toFixed(1),
    ]),
  );

  heading("Overdue corrective actions");
  if (input.overdue.length === 0) doc.text("None.");
  else
    table(
      [
        { label: "Site", width: 110 },
        { label: "Space", width: 80 },
        { label: "Finding", width: 160 },
        { label: "Severity", width: 50 },
        { label: "Due (site time)", width: 100 },
        { label: "Owner", width: width - 500 },
      ],
      input.overdue.map((row) => [
        row.site_name,
        row.space_name,
        row.title,
        row.severity,
        formatInZone(row.due_at, row.time_zone),
        row.owner ?? "No owner",
      ]),
    );

  doc.moveDown(1).fontSize(8).fillColor(warn).text(cautionText, left, doc.y, { width });
  doc.end();
  return done;
}
