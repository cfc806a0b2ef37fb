import { randomUUID } from "node:crypto";

import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import { formatInZone } from "@shared/calc/due";
import type { ComparisonResponse, TrendsResponse } from "@shared/schemas/committee";

import { networks, sites, users } from "../../server/db/schema/index";
import { runDemoSteps } from "../../server/demo/run-demo-steps";
import { demoStepList } from "../../server/demo/steps";
import {
  buildMonthlyReport,
  type OverdueRow,
} from "../../server/modules/committee/committee.report";
import {
  overdueActions,
  rebuildMonthStats,
  syncItemCategories,
} from "../../server/modules/committee/committee.repository";
import { api, testApp } from "../helpers/app";
import { sessionCookieFor } from "../helpers/auth";
import { headerOn, linesOf, readPdfLayout, rowOn, type PdfPage } from "../helpers/pdf-layout";

// A4 with 48 pt margins all round, as the report is set.
const margin = 48;

// The words a reader sees, written here independently of the report's code.
const severityWords: Record<string, string> = {
  critical: "Critical",
  major: "Major",
  minor: "Minor",
};
const stateWords: Record<string, string> = {
  to_fix: "To fix",
  fixing: "Being fixed",
  to_check: "Fix to check",
};
const overdueHeader = ["Site", "Space", "Finding", "Severity", "State", "Due (site time)", "Owner"];
const overdueCells = (row: OverdueRow) => [
  row.site_name,
  row.space_name,
  row.title,
  severityWords[row.severity]!,
  stateWords[row.state]!,
  formatInZone(row.due_at, row.time_zone),
  row.owner ?? "No owner",
];

function expectInsideMargins(pages: PdfPage[]) {
  for (const page of pages)
    for (const item of page.items) {
      const where = `page ${page.number}: "${item.text}" at x ${item.x.toFixed(1)}–${item.right.toFixed(1)}, y ${item.y.toFixed(1)}`;
      expect(item.x, where).toBeGreaterThanOrEqual(margin - 0.5);
      expect(item.right, where).toBeLessThanOrEqual(page.width - margin + 0.5);
      expect(item.y, where).toBeGreaterThanOrEqual(margin);
      expect(item.y, where).toBeLessThanOrEqual(page.height - margin + 0.5);
    }
}

/** Every row whole on one page, under that page's copy of the table's header. */
function expectWholeRows(pages: PdfPage[], header: string[], rows: string[][]) {
  for (const cells of rows) {
    const found = pages.filter((page) => rowOn(page, header, cells) !== null);
    expect(found.length, `row ${cells.join(" | ")}`).toBeGreaterThan(0);
  }
}

function monthsBack(back: number): string {
  const now = new Date();
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 15))
    .toISOString()
    .slice(0, 7);
}

describe("committee report PDF layout", () => {
  it("when the demo network's report for the last twelve months is printed, then every page holds real content, no text crosses a margin and no overdue row is split across pages", async () => {
    const { db, logger, storage, env } = testApp().deps;
    await runDemoSteps(db, logger, demoStepList, { storage, env });
    const [committee] = await db
      .select({ id: users.id, networkId: users.networkId })
      .from(users)
      .where(eq(users.email, "committee@example.org"));
    const demoSites = await db
      .select({ id: sites.id })
      .from(sites)
      .innerJoin(networks, eq(networks.id, sites.networkId))
      .where(eq(networks.id, committee!.networkId));
    // As the server does at start-up on a database whose audits predate the monthly totals.
    await syncItemCategories(db);
    await rebuildMonthStats(
      db,
      demoSites.map((site) => site.id),
    );
    const overdue = await overdueActions(
      db,
      demoSites.map((site) => site.id),
      200,
    );
    expect(overdue.length).toBeGreaterThan(5);

    const response = await api(undefined, { cookie: await sessionCookieFor(committee!.id) })
      .get(`/api/committee/report?from=${monthsBack(11)}&to=${monthsBack(0)}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on("data", (chunk: Buffer) => chunks.push(chunk));
        res.on("end", () => done(null, Buffer.concat(chunks)));
      });
    expect(response.status).toBe(200);
    const pages = await readPdfLayout(response.body as Buffer);

    expect(pages.length).toBeGreaterThan(1);
    for (const page of pages)
      expect(linesOf(page).length, `lines on page ${page.number}`).toBeGreaterThanOrEqual(3);
    expectInsideMargins(pages);
    expectWholeRows(pages, overdueHeader, overdue.map(overdueCells));
    // People's words, not stored codes.
    const text = pages.flatMap((page) => page.items.map((item) => item.text)).join(" ");
    expect(text).not.toMatch(
      /\b(critical|major|minor|to_fix|fixing|to_check|gaps_to_fix|all_clear)\b/,
    );
    expect(text).toContain("All clear");
  });

  it("when many overdue actions with long names fill several pages, then each page of the table starts with its header and each row stays whole inside the margins", async () => {
    const siteName = "St Bartholomew's Regional Infectious Diseases Hospital";
    const overdue: OverdueRow[] = Array.from({ length: 70 }, (_, n) => ({
      id: randomUUID(),
      site_name: siteName,
      space_name: `Negative-pressure isolation suite ${n + 1}, east wing anteroom and lobby`,
      title:
        n % 3 === 0
          ? "Door closer does not return the anteroom door to fully shut within the time allowed"
          : `Hand hygiene station ${n} empty`,
      severity: (["critical", "major", "minor"] as const)[n % 3]!,
      state: (["to_fix", "fixing", "to_check"] as const)[n % 3]!,
      due_at: new Date(Date.UTC(2026, 0, 1 + (n % 28), 6, 20)),
      owner: n % 7 === 0 ? null : `Tobias Fenwright-Montgomery-Aldersgate ${n}`,
      time_zone: "Europe/London",
    }));
    const comparison: ComparisonResponse = {
      networkName: "Long Table Health",
      from: "2026-01",
      to: "2026-03",
      zoneType: null,
      confidence: 0.95,
      minimumRankedSample: 10,
      network: { n: 0, successes: 0, rate: null, interval: null, smallSample: true },
      sites: [],
      difference: null,
    };
    const trends: TrendsResponse = {
      from: "2026-01",
      to: "2026-03",
      zoneType: null,
      sites: [],
      aging: [],
      closeTimes: [],
    };
    const pdf = await buildMonthlyReport({
      comparison,
      trends,
      overdue,
      generatedAt: new Date("2026-04-01T09:00:00Z"),
    });
    const pages = await readPdfLayout(pdf);

    const withRows = pages.filter((page) =>
      overdue.some((row) => rowOn(page, overdueHeader, overdueCells(row)) !== null),
    );
    expect(withRows.length).toBeGreaterThanOrEqual(3);
    // Each page the table continues on starts with the header, at the top of the page.
    for (const page of withRows.slice(1))
      expect(headerOn(page, overdueHeader)!.y, `header on page ${page.number}`).toBeLessThan(
        margin + 16,
      );
    expectWholeRows(pages, overdueHeader, overdue.map(overdueCells));
    expectInsideMargins(pages);
    for (const page of pages)
      expect(linesOf(page).length, `lines on page ${page.number}`).toBeGreaterThanOrEqual(3);
  });
});
