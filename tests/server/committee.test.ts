import { randomUUID } from "node:crypto";

import { beforeAll, describe, expect, it } from "vitest";

import { categoryOfItem } from "@shared/checklists/categories";
import type { ComparisonResponse, SiteDrillDown, TrendsResponse } from "@shared/schemas/committee";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import { auditAnswers, audits, correctiveActions } from "../../server/db/schema/index";
import {
  checklistItemsOf,
  ensureDefaultChecklists,
  latestPublishedVersion,
} from "../../server/modules/checklists/checklists.service";
import {
  exportAuditRows,
  rebuildMonthStats,
  syncItemCategories,
} from "../../server/modules/committee/committee.repository";
import { answeredDraftAudit, insertFloor, insertSpace } from "../factories/audits";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { readExport } from "../helpers/csv";

// Computed here independently of the server: the Wilson score interval (Newcombe 1998, method 3)
// and Newcombe's hybrid score interval for a difference (Newcombe 1998, method 10), z for 95%.
const z = 1.959963984540054;
function wilson(x: number, n: number) {
  const p = x / n;
  const centre = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / (1 + (z * z) / n);
  return { lower: x === 0 ? 0 : centre - half, upper: x === n ? 1 : centre + half };
}
function newcombe(x1: number, n1: number, x2: number, n2: number) {
  const [a, b] = [wilson(x1, n1), wilson(x2, n2)];
  const [p1, p2] = [x1 / n1, x2 / n2];
  return {
    lower: p1 - p2 - Math.sqrt((p1 - a.lower) ** 2 + (b.upper - p2) ** 2),
    upper: p1 - p2 + Math.sqrt((a.upper - p1) ** 2 + (p2 - b.lower) ** 2),
  };
}

const day = 24 * 3600 * 1000;
const monthKey = (date: Date) => date.toISOString().slice(0, 7);
/** Noon UTC on the 15th, `back` months before now: well inside the month on a London clock. */
function midMonth(back: number): Date {
  const now = new Date();
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 15, 12));
}

interface SeededAudit {
  siteId: string;
  month: string;
  verdict: "all_clear" | "gaps_to_fix" | "hold";
  answers: { key: string; outcome: "pass" | "fail" | "not_applicable" }[];
}

describe("committee view", () => {
  const seeded: SeededAudit[] = [];
  const siteIds: string[] = [];
  const names = ["Alder Site", "Birch Site", "Cedar Site"];
  let networkId = "";
  const networkName = `Committee Test Network ${randomUUID().slice(0, 6)}`;
  let committee: SignedInPerson;
  let auditorA: SignedInPerson;
  let spacesBySite: Map<string, { id: string; siteId: string; zoneType: ZoneType }[]>;
  const from = monthKey(midMonth(11));
  const to = monthKey(midMonth(0));

  beforeAll(async () => {
    const { db } = testApp().deps;
    networkId = (await insertNetwork(db, networkName)).id;
    await ensureDefaultChecklists(db, networkId);
    const items = new Map<ZoneType, ChecklistItem[]>();
    const versions = new Map<ZoneType, string>();
    for (const zone of ["doffing_area", "isolation_room"] as const) {
      const version = (await latestPublishedVersion(db, networkId, zone))!;
      versions.set(zone, version.id);
      items.set(zone, await checklistItemsOf(db, version.id));
    }
    spacesBySite = new Map();
    for (const name of names) {
      const site = await insertSite(db, networkId, { name: `${name} ${randomUUID().slice(0, 4)}` });
      siteIds.push(site.id);
      const floor = await insertFloor(db, site.id);
      spacesBySite.set(site.id, [
        await insertSpace(db, floor, "doffing_area"),
        await insertSpace(db, floor, "isolation_room"),
      ]);
    }
    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    auditorA = await signInAs(networkId, [{ role: "auditor", siteId: siteIds[0]! }]);

    // A known story: Alder 40 audits, Birch 36, Cedar 8 (too few to rank), over six months.
    const plan = [
      { site: 0, count: 40, failEvery: 4 },
      { site: 1, count: 36, failEvery: 2 },
      { site: 2, count: 8, failEvery: 3 },
    ];
    const auditRows: (typeof audits.$inferInsert)[] = [];
    const answerRows: (typeof auditAnswers.$inferInsert)[] = [];
    for (const { site, count, failEvery } of plan) {
      const siteId = siteIds[site]!;
      for (let n = 0; n < count; n += 1) {
        const space = spacesBySite.get(siteId)![n % 2]!;
        const at = new Date(midMonth(n % 6).getTime() + (n % 5) * 3600 * 1000);
        const list = items.get(space.zoneType)!;
        const fails = n % failEvery === 0;
        const answers = list.map((item, index) => ({
          item,
          outcome:
            fails && index === n % list.length
              ? ("fail" as const)
              : index === (n + 3) % list.length && item.severity !== "critical"
                ? ("not_applicable" as const)
                : ("pass" as const),
        }));
        const failedItem = answers.find((a) => a.outcome === "fail")?.item;
        const verdict = !failedItem
          ? "all_clear"
          : failedItem.severity === "critical"
            ? "hold"
            : "gaps_to_fix";
        const id = randomUUID();
        auditRows.push({
          id,
          siteId,
          spaceId: space.id,
          checklistVersionId: versions.get(space.zoneType)!,
          auditorId: auditorA.user.id,
          status: "submitted",
          startedAt: at,
          submittedAt: at,
          verdict,
          score: null,
        });
        for (const answer of answers)
          answerRows.push({
            id: randomUUID(),
            auditId: id,
            itemId: answer.item.id,
            outcome: answer.outcome,
          });
        seeded.push({
          siteId,
          month: monthKey(at),
          verdict,
          answers: answers.map((a) => ({ key: a.item.key, outcome: a.outcome })),
        });
      }
    }
    await db.insert(audits).values(auditRows);
    for (let i = 0; i < answerRows.length; i += 1000)
      await db.insert(auditAnswers).values(answerRows.slice(i, i + 1000));
    // What start-up and the demo do for audits that were not submitted through the app.
    await syncItemCategories(db);
    await rebuildMonthStats(db, siteIds);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });
  const readiness = (siteId: string) => {
    const rows = seeded.filter((row) => row.siteId === siteId);
    return { n: rows.length, ready: rows.filter((row) => row.verdict === "all_clear").length };
  };

  it("when the committee compares the sites, then each rate and interval matches a computation over the seeded rows", async () => {
    const response = await as(committee).get(
      `/api/committee/comparison?from=${from}&to=${to}&siteA=${siteIds[0]}&siteB=${siteIds[1]}`,
    );
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const body = response.body as ComparisonResponse;
    expect(body.sites.map((site) => site.siteId).sort()).toEqual([...siteIds].sort());

    for (const siteId of siteIds) {
      const expected = readiness(siteId);
      const site = body.sites.find((row) => row.siteId === siteId)!;
      expect(site.readiness.n).toBe(expected.n);
      expect(site.readiness.successes).toBe(expected.ready);
      expect(site.readiness.rate).toBeCloseTo(expected.ready / expected.n, 12);
      const interval = wilson(expected.ready, expected.n);
      expect(site.readiness.interval!.lower).toBeCloseTo(interval.lower, 10);
      expect(site.readiness.interval!.upper).toBeCloseTo(interval.upper, 10);

      // Compliance by item group: answers that passed out of those that applied.
      const byCategory = new Map<string, { applicable: number; passed: number }>();
      for (const row of seeded.filter((r) => r.siteId === siteId))
        for (const answer of row.answers) {
          if (answer.outcome === "not_applicable") continue;
          const counts = byCategory.get(categoryOfItem(answer.key)) ?? { applicable: 0, passed: 0 };
          counts.applicable += 1;
          if (answer.outcome === "pass") counts.passed += 1;
          byCategory.set(categoryOfItem(answer.key), counts);
        }
      expect(site.categories.map((c) => c.category).sort()).toEqual([...byCategory.keys()].sort());
      for (const category of site.categories) {
        const counts = byCategory.get(category.category)!;
        expect([category.successes, category.n]).toEqual([counts.passed, counts.applicable]);
        expect(category.interval!.lower).toBeCloseTo(
          wilson(counts.passed, counts.applicable).lower,
          10,
        );
      }
    }

    // Cedar has 8 audits: flagged, not ranked; the other two are ranked by rate.
    const [alder, birch, cedar] = siteIds.map((id) => body.sites.find((s) => s.siteId === id)!);
    expect(cedar!.readiness.smallSample).toBe(true);
    expect(cedar!.rank).toBeNull();
    expect(alder!.rank).toBe(1);
    expect(birch!.rank).toBe(2);

    const a = readiness(siteIds[0]!);
    const b = readiness(siteIds[1]!);
    const difference = newcombe(a.ready, a.n, b.ready, b.n);
    expect(body.difference!.difference).toBeCloseTo(a.ready / a.n - b.ready / b.n, 12);
    expect(body.difference!.interval.lower).toBeCloseTo(difference.lower, 10);
    expect(body.difference!.interval.upper).toBeCloseTo(difference.upper, 10);
    expect(body.difference!.excludesZero).toBe(difference.lower > 0 || difference.upper < 0);

    const total = seeded.length;
    expect(body.network.n).toBe(total);
    expect(body.network.successes).toBe(seeded.filter((r) => r.verdict === "all_clear").length);
  });

  it("when one zone type or a shorter period is chosen, then only those audits count", async () => {
    const month = monthKey(midMonth(2));
    const response = await as(committee).get(
      `/api/committee/comparison?from=${month}&to=${month}&zoneType=isolation_room`,
    );
    const body = response.body as ComparisonResponse;
    for (const siteId of siteIds) {
      const isolation = new Set(
        spacesBySite
          .get(siteId)!
          .filter((s) => s.zoneType === "isolation_room")
          .map((s) => s.id),
      );
      expect(isolation.size).toBe(1);
      // Odd-numbered audits went to the isolation room; month index n % 6 === 2 only.
      const expected = seeded.filter(
        (row) =>
          row.siteId === siteId &&
          row.month === month &&
          row.answers.some((a) => a.key.startsWith("room.")),
      );
      const site = body.sites.find((s) => s.siteId === siteId)!;
      expect(site.readiness.n).toBe(expected.length);
    }
  });

  it("when an audit is submitted through the app, then the monthly totals count it at once", async () => {
    const before = (await as(committee).get(`/api/committee/comparison?from=${from}&to=${to}`))
      .body as ComparisonResponse;
    const space = spacesBySite.get(siteIds[0]!)![0]!;
    const { auditId } = await answeredDraftAudit(testApp().deps, {
      networkId,
      space,
      auditorId: auditorA.user.id,
      fail: ["Spare clean gloves in several sizes"],
    });
    expect((await as(auditorA).post(`/api/audits/${auditId}/submit`)).status).toBe(200);
    const after = (await as(committee).get(`/api/committee/comparison?from=${from}&to=${to}`))
      .body as ComparisonResponse;
    const [was, now] = [before, after].map((b) => b.sites.find((s) => s.siteId === siteIds[0])!);
    expect(now!.readiness.n).toBe(was!.readiness.n + 1);
    expect(now!.verdicts.gaps_to_fix).toBe(was!.verdicts.gaps_to_fix + 1);
    const supply = (s: typeof now) => s!.categories.find((c) => c.category === "ppe_supply")!;
    expect(supply(now).n - supply(was).n).toBe(2); // spare gloves and wipes applied
    expect(supply(now).successes - supply(was).successes).toBe(1); // wipes passed

    // And the amendment path moves the counts with the verdict.
    const detail = (await as(committee).get(`/api/audits/${auditId}`)).body;
    const gloves = detail.items.find((i: { text: string }) =>
      i.text.startsWith("Spare clean gloves"),
    );
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: null }]);
    await as(admin)
      .post(`/api/audits/${auditId}/amendments`)
      .send({ itemId: gloves.id, outcome: "pass", reason: "Gloves were on the other shelf" });
    const amended = (await as(committee).get(`/api/committee/comparison?from=${from}&to=${to}`))
      .body as ComparisonResponse;
    const site = amended.sites.find((s) => s.siteId === siteIds[0])!;
    expect(site.readiness.n).toBe(now!.readiness.n);
    expect(site.readiness.successes).toBe(now!.readiness.successes + 1);
    expect(supply(site).successes).toBe(supply(now).successes + 1);
  });

  it("when trends are asked for, then each site's p-chart has its months, centre and limits from the rows", async () => {
    const response = await as(committee).get(`/api/committee/trends?from=${from}&to=${to}`);
    expect(response.status).toBe(200);
    const body = response.body as TrendsResponse;
    const cedar = body.sites.find((s) => s.siteId === siteIds[2])!;
    const rows = seeded.filter((row) => row.siteId === siteIds[2]);
    const months = [...new Set(rows.map((row) => row.month))].sort();
    // Cedar's eight audits fall in six months; the other months of the period are left out.
    expect(cedar.points.map((p) => p.month)).toEqual(months);
    const ready = rows.filter((row) => row.verdict === "all_clear").length;
    expect(cedar.centre).toBeCloseTo(ready / rows.length, 12);
    for (const point of cedar.points) {
      const inMonth = rows.filter((row) => row.month === point.month);
      expect(point.audits).toBe(inMonth.length);
      const sigma = Math.sqrt((cedar.centre! * (1 - cedar.centre!)) / inMonth.length);
      expect(point.upper).toBeCloseTo(Math.min(1, cedar.centre! + 3 * sigma), 12);
      expect(point.lower).toBeCloseTo(Math.max(0, cedar.centre! - 3 * sigma), 12);
    }
  });

  it("when actions are open, overdue or closed, then they are aged in buckets and closing times have medians", async () => {
    const { db } = testApp().deps;
    const siteId = siteIds[1]!;
    const space = spacesBySite.get(siteId)![0]!;
    const [floorRow] = await db.query.spaces.findMany({ where: (s, { eq }) => eq(s.id, space.id) });
    const now = Date.now();
    const action = (openedDays: number, dueDays: number, closed?: { days: number }) => ({
      siteId,
      spaceId: space.id,
      floorId: floorRow!.floorId,
      itemKey: `k-${randomUUID().slice(0, 6)}`,
      title: "Aged action",
      severity: "major" as const,
      state: closed ? ("done" as const) : ("to_fix" as const),
      openedAt: new Date(now - openedDays * day),
      dueAt: new Date(now - dueDays * day),
      closedAt: closed ? new Date(now - openedDays * day + closed.days * day) : null,
      daysToClose: closed?.days ?? null,
      x: 1,
      y: 1,
    });
    await db.insert(correctiveActions).values([
      action(3, -4), // open 3 days, not yet due
      action(10, 3), // open 10 days, 3 days overdue
      action(45, 38), // 45 days, 38 overdue
      action(100, 93), // 100 days, 93 overdue
      action(40, 33, { days: 2 }),
      action(40, 33, { days: 4 }),
      action(40, 33, { days: 9 }),
    ]);
    const body = (await as(committee).get(`/api/committee/trends?from=${from}&to=${to}`))
      .body as TrendsResponse;
    const aging = body.aging.find((row) => row.siteId === siteId)!;
    expect(aging.unfinished).toEqual({ "0-7": 1, "8-30": 1, "31-90": 1, "90+": 1 });
    expect(aging.overdue).toEqual({ "0-7": 1, "8-30": 0, "31-90": 1, "90+": 1 });
    const closing = body.closeTimes.find(
      (row) => row.siteId === siteId && row.severity === "major",
    )!;
    expect(closing).toMatchObject({ closed: 3, medianDays: 4 });
  });

  it("when the committee drills into a site, then each space shows its audits, latest verdict and open work", async () => {
    const siteId = siteIds[2]!;
    const response = await as(committee).get(
      `/api/committee/sites/${siteId}?from=${from}&to=${to}`,
    );
    expect(response.status).toBe(200);
    const body = response.body as SiteDrillDown;
    expect(body.spaces).toHaveLength(2);
    const total = body.spaces.reduce((sum, space) => sum + space.readiness.n, 0);
    expect(total).toBe(seeded.filter((row) => row.siteId === siteId).length);
    expect(body.spaces.every((space) => space.lastVerdict !== null)).toBe(true);
  });

  it("when the report and the CSVs are downloaded, then they are a PDF naming the network and CSVs of the comparison and audits that parse with the header first and the caution last", async () => {
    const pdf = await as(committee)
      .get(`/api/committee/report?from=${from}&to=${to}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on("data", (chunk: Buffer) => chunks.push(chunk));
        res.on("end", () => done(null, Buffer.concat(chunks)));
      });
    expect(pdf.status).toBe(200);
    expect(pdf.headers["content-type"]).toBe("application/pdf");
    const bytes = pdf.body as Buffer;
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    expect(Number(pdf.headers["content-length"])).toBe(bytes.length);
    // The document's title carries the network's name (an uncompressed info string).
    expect(bytes.toString("latin1")).toContain(`(${networkName}: infection prevention readiness`);
    expect(bytes.toString("latin1")).toContain("NotoSans");

    const comparison = await as(committee).get(
      `/api/committee/comparison/export?from=${from}&to=${to}`,
    );
    expect(comparison.headers["content-type"]).toMatch(/^text\/csv/);
    const comparisonCsv = readExport(comparison.text);
    expect(comparisonCsv.header).toEqual([
      "site",
      "measure",
      "all-clear audits or items passed",
      "audits or items answered",
      "share (0 to 1)",
      "95% interval low (Wilson)",
      "95% interval high (Wilson)",
      "small sample (fewer than 30)",
      "rank among sites",
    ]);
    const readiness = comparisonCsv.objects.filter(
      (row) => row["measure"] === "Readiness: all-clear audits out of audits",
    );
    expect(readiness).toHaveLength(3);

    const auditsCsv = await as(committee).get(`/api/committee/audits/export?from=${from}&to=${to}`);
    const audits = readExport(auditsCsv.text);
    expect(audits.header[0]).toBe("audit id");
    expect(audits.rows).toHaveLength(seeded.length + 1); // plus the one submitted over HTTP
    // Verdicts in words, never the stored code.
    expect(
      audits.objects.every((row) =>
        ["All clear", "Gaps to fix", "Hold until fixed"].includes(row["verdict"]!),
      ),
    ).toBe(true);
  });

  it("when the audits are exported in small batches, then every audit comes once, oldest first", async () => {
    const batches: number[] = [];
    const seen: { id: string; at: number }[] = [];
    await exportAuditRows(
      testApp().deps.db,
      siteIds,
      { from, to },
      async (rows) => {
        batches.push(rows.length);
        seen.push(...rows.map((row) => ({ id: row.id, at: row.submitted_at.getTime() })));
      },
      10,
    );
    expect(batches.length).toBeGreaterThan(8);
    expect(batches.slice(0, -1).every((n) => n === 10)).toBe(true);
    expect(new Set(seen.map((row) => row.id)).size).toBe(seen.length);
    expect(seen.length).toBeGreaterThanOrEqual(seeded.length);
    const times = seen.map((row) => row.at);
    expect(times).toEqual([...times].sort((a, b) => a - b));
  });

  it("when the period is not a period, then 400 names the field", async () => {
    const backwards = await as(committee).get(`/api/committee/comparison?from=2026-05&to=2026-01`);
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields).toHaveProperty("to");
    const bad = await as(committee).get(`/api/committee/trends?from=May&to=2026-01`);
    expect(bad.body.error.fields).toHaveProperty("from");
    const long = await as(committee).get(`/api/committee/trends?from=2020-01&to=2026-01`);
    expect(long.body.error.fields.to).toMatch(/36 months/);
    const stranger = await as(committee).get(
      `/api/committee/comparison?from=${from}&to=${to}&siteA=${siteIds[0]}&siteB=${randomUUID()}`,
    );
    expect(stranger.status).toBe(400);
    expect(stranger.body.error.fields).toHaveProperty("siteB");
  });

  it("when an auditor of one site asks, then only that site is compared", async () => {
    const body = (await as(auditorA).get(`/api/committee/comparison?from=${from}&to=${to}`))
      .body as ComparisonResponse;
    expect(body.sites.map((s) => s.siteId)).toEqual([siteIds[0]]);
  });
});
