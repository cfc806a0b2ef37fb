import { randomUUID } from "node:crypto";

import { beforeAll, describe, expect, it } from "vitest";

import type { ObservationCommitteeResponse } from "@shared/schemas/observations";

import { insertFloor, insertSpace } from "../factories/audits";
import {
  insertObservations,
  insertSequence,
  type ObservationRecord,
  type SeededSequence,
} from "../factories/committee-observations";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { readExport } from "../helpers/csv";
import { readPdfLayout } from "../helpers/pdf-layout";

// Recomputed here independently of the server: the Wilson score interval (Wilson 1927; Newcombe
// 1998, method 3), z for 95%, and every count by plain iteration over the seeded rows.
const z = 1.959963984540054;
function wilson(x: number, n: number) {
  const p = x / n;
  const centre = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / (1 + (z * z) / n);
  return { lower: x === 0 ? 0 : centre - half, upper: x === n ? 1 : centre + half };
}

/** Noon UTC on the 15th, `back` months before now: well inside the month on a London clock. */
function midMonth(back: number, hour = 12): Date {
  const now = new Date();
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 15, hour));
}
const monthKey = (date: Date) => date.toISOString().slice(0, 7);

/** A small fixed sequence of numbers in [0, 1), so the seeded story is the same every run. */
function numbers(seed: number) {
  let state = seed;
  return () => {
    state = (state * 1103515245 + 12345) % 2147483648;
    return state / 2147483648;
  };
}

describe("committee figures on observed putting-on and removal", () => {
  const records: ObservationRecord[] = [];
  const siteIds: string[] = [];
  const siteNames: string[] = [];
  const codes: string[] = [];
  let committee: SignedInPerson;
  let committeeAtAlder: SignedInPerson;
  const from = monthKey(midMonth(11));
  const to = monthKey(midMonth(0));

  beforeAll(async () => {
    const { db } = testApp().deps;
    const networkId = (await insertNetwork(db)).id;
    const removalSteps = [
      { key: "gloves", text: "Take off the gloves", handHygiene: false },
      { key: "hands-1", text: "Clean your hands", handHygiene: true },
      { key: "gown", text: "Take off the gown, rolling it inward", handHygiene: false },
      {
        key: "mask",
        text: "Take off the mask by its straps, then clean your hands",
        handHygiene: true,
      },
    ];
    const removal1 = await insertSequence(db, networkId, {
      key: "committee-removal",
      title: "Removal, example 1",
      steps: removalSteps,
    });
    // Version 2 rewords the gloves step: its counts join version 1's under the newer words.
    const removal2 = await insertSequence(db, networkId, {
      key: "committee-removal",
      title: "Removal, example 1 (reworded)",
      version: 2,
      steps: removalSteps.map((step) =>
        step.key === "gloves"
          ? { ...step, text: "Take off the gloves, outside never touching skin" }
          : step,
      ),
    });
    const enhanced = await insertSequence(db, networkId, {
      key: "committee-enhanced",
      title: "Enhanced removal",
      steps: [
        { key: "outer-gloves", text: "Take off the outer gloves", handHygiene: false },
        { key: "gloved-hands", text: "Clean the gloved hands", handHygiene: true },
      ],
    });
    const observer = await signInAs(networkId, []);

    // Alder: 8 staff codes, 10 observations past retention; also an enhanced sequence observed
    // 35 times on 2 staff codes only. Birch: 3 staff codes (withheld). Cedar: 6 staff codes.
    const plan = [
      { name: "Alder", codes: 8, count: 90, withoutCode: 10, seed: 7 },
      { name: "Birch", codes: 3, count: 24, withoutCode: 0, seed: 11 },
      { name: "Cedar", codes: 6, count: 45, withoutCode: 0, seed: 13 },
    ];
    for (const site of plan) {
      const row = await insertSite(db, networkId, {
        name: `${site.name} ${randomUUID().slice(0, 4)}`,
      });
      siteIds.push(row.id);
      siteNames.push(row.name);
      const space = await insertSpace(db, await insertFloor(db, row.id), "doffing_area");
      const random = numbers(site.seed);
      const siteCodes = Array.from(
        { length: site.codes },
        (_, n) => `QX${site.name.slice(0, 2).toUpperCase()}-${70 + n}`,
      );
      codes.push(...siteCodes);
      const observe = (
        n: number,
        sequence: SeededSequence,
        staffCode: string | null,
        minutes = 0,
      ) => {
        const back = 11 - (n % 12);
        const breachedSteps = sequence.steps
          .filter((step) => random() < (step.key === "gloves" || step.key === "gown" ? 0.35 : 0.1))
          .map((step) => step.key);
        const expected = sequence.steps.filter((step) => step.handHygiene).length;
        const performed = random() < 0.7 ? expected : expected - 1;
        records.push({
          siteId: row.id,
          spaceId: space.id,
          observerId: observer.user.id,
          sequence,
          staffCode,
          // Several an hour apart within the month, so each staff code's order is plain.
          finishedAt: new Date(midMonth(back, 1 + Math.floor(n / 12)).getTime() + minutes * 60_000),
          breachedSteps,
          handHygiene: { performed, expected },
          coachingGiven: breachedSteps.length > 0 && random() < 0.8,
        });
      };
      for (let n = 0; n < site.count; n += 1)
        observe(n, n % 12 >= 9 ? removal2 : removal1, siteCodes[n % site.codes]!);
      for (let n = 0; n < site.withoutCode; n += 1) observe(n, removal1, null);
      if (site.name === "Alder")
        for (let n = 0; n < 35; n += 1) observe(n, enhanced, siteCodes[n % 2]!, 30);
    }
    // Outside the period: counted nowhere.
    records.push({ ...records[0]!, finishedAt: midMonth(13) });
    await insertObservations(db, records);
    records.pop();

    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    committeeAtAlder = await signInAs(networkId, [
      { role: "committee_member", siteId: siteIds[0]! },
    ]);
  });

  const as = (person: SignedInPerson) => api(undefined, { cookie: person.cookie });

  /** What the figures should be for these records, worked out plainly. */
  function expected(rows: ObservationRecord[]) {
    const people = (list: ObservationRecord[]) => {
      const known = new Set(
        list.filter((r) => r.staffCode).map((r) => `${r.siteId}/${r.staffCode}`),
      );
      return Math.max(known.size, list.some((r) => r.staffCode === null) ? 1 : 0);
    };
    const steps = new Map<string, { n: number; breached: number; rows: ObservationRecord[] }>();
    for (const row of rows)
      for (const step of row.sequence.steps) {
        const key = `${row.sequence.key}/${step.key}`;
        const entry = steps.get(key) ?? { n: 0, breached: 0, rows: [] };
        entry.n += 1;
        if (row.breachedSteps.includes(step.key)) entry.breached += 1;
        entry.rows.push(row);
        steps.set(key, entry);
      }
    const withMoments = rows.filter((r) => r.handHygiene.expected > 0);
    const performed = withMoments.reduce((sum, r) => sum + r.handHygiene.performed, 0);
    const moments = withMoments.reduce((sum, r) => sum + r.handHygiene.expected, 0);
    // After coaching: per site and staff code, in time order, the first coached observation
    // that another followed; clean when that next one had no breach.
    let coached = 0;
    let clean = 0;
    const byCode = new Map<string, ObservationRecord[]>();
    for (const row of rows.filter((r) => r.staffCode !== null)) {
      const key = `${row.siteId}/${row.staffCode}`;
      byCode.set(key, [...(byCode.get(key) ?? []), row]);
    }
    for (const list of byCode.values()) {
      list.sort((a, b) => a.finishedAt.getTime() - b.finishedAt.getTime());
      const index = list.findIndex((r, i) => r.coachingGiven && i + 1 < list.length);
      if (index === -1) continue;
      coached += 1;
      if (list[index + 1]!.breachedSteps.length === 0) clean += 1;
    }
    const months = new Map<string, number>();
    for (const row of rows)
      months.set(monthKey(row.finishedAt), (months.get(monthKey(row.finishedAt)) ?? 0) + 1);
    return {
      observations: rows.length,
      suppressed: people(rows) < 5,
      steps: [...steps].map(([key, entry]) => ({
        key,
        n: entry.n,
        breached: entry.breached,
        suppressed: people(entry.rows) < 5,
      })),
      handHygiene: {
        n: withMoments.length,
        all: withMoments.filter((r) => r.handHygiene.performed === r.handHygiene.expected).length,
        momentRate: performed / moments,
      },
      months,
      coached,
      clean,
    };
  }

  function expectFigures(
    figures: ObservationCommitteeResponse["network"],
    rows: ObservationRecord[],
  ) {
    const want = expected(rows);
    expect(figures.observations).toBe(want.observations);
    expect(figures.suppressed).toBe(want.suppressed);
    for (const month of figures.perMonth)
      expect(month.observations, month.month).toBe(want.months.get(month.month) ?? 0);
    expect(figures.perMonth.reduce((sum, m) => sum + m.observations, 0)).toBe(want.observations);
    if (want.suppressed) {
      expect(figures.steps).toEqual([]);
      expect(figures.handHygieneAllMoments.rate).toBeNull();
      expect(figures.cleanAfterCoaching.rate).toBeNull();
      return;
    }
    expect(figures.steps.map((s) => `${s.sequenceKey}/${s.stepKey}`).sort()).toEqual(
      want.steps.map((s) => s.key).sort(),
    );
    for (const step of want.steps) {
      const got = figures.steps.find((s) => `${s.sequenceKey}/${s.stepKey}` === step.key)!;
      expect(got.suppressed, step.key).toBe(step.suppressed);
      if (step.suppressed) {
        expect(got.breached.rate).toBeNull();
        continue;
      }
      expect([got.breached.successes, got.breached.n], step.key).toEqual([step.breached, step.n]);
      expect(got.breached.rate).toBeCloseTo(step.breached / step.n, 12);
      expect(got.breached.interval!.lower).toBeCloseTo(wilson(step.breached, step.n).lower, 10);
      expect(got.breached.interval!.upper).toBeCloseTo(wilson(step.breached, step.n).upper, 10);
      expect(got.breached.smallSample).toBe(step.n < 30);
    }
    // The five most error-prone: ranked by rate among unwithheld steps of 30 or more.
    const ranked = want.steps
      .filter((s) => !s.suppressed && s.n >= 30 && s.breached > 0)
      .sort(
        (a, b) =>
          b.breached / b.n - a.breached / a.n ||
          wilson(b.breached, b.n).lower - wilson(a.breached, a.n).lower,
      )
      .slice(0, 5)
      .map((s) => s.key);
    expect(figures.mostErrorProne.map((s) => `${s.sequenceKey}/${s.stepKey}`)).toEqual(ranked);
    const hand = want.handHygiene;
    expect([figures.handHygieneAllMoments.successes, figures.handHygieneAllMoments.n]).toEqual([
      hand.all,
      hand.n,
    ]);
    expect(figures.handHygieneAllMoments.interval!.lower).toBeCloseTo(
      wilson(hand.all, hand.n).lower,
      10,
    );
    expect(figures.handHygieneMomentRate).toBeCloseTo(hand.momentRate, 12);
    if (want.coached >= 5) {
      expect(figures.cleanAfterCoaching.suppressed).toBe(false);
      expect([figures.cleanAfterCoaching.successes, figures.cleanAfterCoaching.n]).toEqual([
        want.clean,
        want.coached,
      ]);
      expect(figures.cleanAfterCoaching.interval!.upper).toBeCloseTo(
        wilson(want.clean, want.coached).upper,
        10,
      );
    } else expect(figures.cleanAfterCoaching.suppressed).toBe(want.coached > 0);
  }

  it("when the committee reads the network's figures, then every site's and the network's rates match a plain recount of the seeded observations", async () => {
    const response = await as(committee).get(`/api/committee/observations?from=${from}&to=${to}`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const body = response.body as ObservationCommitteeResponse;
    expect(body.minimumStaffCodes).toBe(5);
    expect(body.network.perMonth).toHaveLength(12);
    expect(body.sites.map((s) => s.siteId).sort()).toEqual([...siteIds].sort());
    siteIds.forEach((siteId) =>
      expectFigures(
        body.sites.find((s) => s.siteId === siteId)!,
        records.filter((r) => r.siteId === siteId),
      ),
    );
    expectFigures(body.network, records);

    const [alder, birch] = siteIds.map((id) => body.sites.find((s) => s.siteId === id)!);
    // Birch's 3 staff codes: withheld whole, its count kept.
    expect(birch!.suppressed).toBe(true);
    expect(birch!.observations).toBe(24);
    // Alder's enhanced sequence was seen on 2 staff codes: its steps are withheld, 35 observations or not.
    const enhancedSteps = alder!.steps.filter((s) => s.sequenceKey === "committee-enhanced");
    expect(enhancedSteps).toHaveLength(2);
    expect(enhancedSteps.every((s) => s.suppressed && s.breached.rate === null)).toBe(true);
    // Observations past retention still count: 90 + 10 removal observations at Alder.
    const gloves = alder!.steps.find((s) => s.stepKey === "gloves")!;
    expect(gloves.breached.n).toBe(100);
    // The newest version's words and title.
    expect(gloves.stepText).toBe("Take off the gloves, outside never touching skin");
    expect(gloves.sequenceTitle).toBe("Removal, example 1 (reworded)");
    expect(alder!.cleanAfterCoaching.n).toBeGreaterThanOrEqual(5);

    for (const code of codes) expect(JSON.stringify(body)).not.toContain(code);
  });

  it("when a committee member of one site asks, then only that site is counted, in the site and in the network", async () => {
    const response = await as(committeeAtAlder).get(
      `/api/committee/observations?from=${from}&to=${to}`,
    );
    expect(response.status).toBe(200);
    const body = response.body as ObservationCommitteeResponse;
    expect(body.sites.map((s) => s.siteId)).toEqual([siteIds[0]]);
    const alder = records.filter((r) => r.siteId === siteIds[0]);
    expectFigures(body.network, alder);
    expect(body.network.observations).toBe(135);
  });

  it("when the figures are downloaded as CSV and in the monthly report, then they carry the same counts and never a staff code", async () => {
    const csv = await as(committee).get(`/api/committee/observations/export?from=${from}&to=${to}`);
    expect(csv.status).toBe(200);
    expect(csv.headers["content-type"]).toMatch(/^text\/csv/);
    const { header, objects } = readExport(csv.text);
    expect(header.slice(0, 7)).toEqual([
      "site",
      "measure",
      "sequence",
      "step",
      "month",
      "count",
      "out of",
    ]);
    const json = (await as(committee).get(`/api/committee/observations?from=${from}&to=${to}`))
      .body as ObservationCommitteeResponse;
    const alder = json.sites.find((s) => s.siteId === siteIds[0])!;
    const gloves = alder.steps.find((s) => s.stepKey === "gloves")!;
    const row = objects.find((o) => o.site === siteNames[0] && o.step === gloves.stepText)!;
    expect([Number(row.count), Number(row["out of"])]).toEqual([
      gloves.breached.successes,
      gloves.breached.n,
    ]);
    expect(Number(row["95% interval low (Wilson)"])).toBeCloseTo(
      gloves.breached.interval!.lower,
      4,
    );
    const birchRows = objects.filter((o) => o.site === siteNames[1]);
    expect(birchRows.find((o) => o.measure === "Observations")!.count).toBe("24");
    expect(
      birchRows.filter((o) => o.count !== "" && !o.measure!.startsWith("Observations")),
    ).toEqual([]);
    expect(birchRows.some((o) => o["withheld (fewer than 5 staff codes)"] === "yes")).toBe(true);

    const report = await as(committee)
      .get(`/api/committee/report?from=${from}&to=${to}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on("data", (chunk: Buffer) => chunks.push(chunk));
        res.on("end", () => done(null, Buffer.concat(chunks)));
      });
    expect(report.status).toBe(200);
    const text = (await readPdfLayout(report.body as Buffer))
      .flatMap((page) => page.items.map((item) => item.text))
      .join(" ");
    expect(text).toContain("Observed putting-on and removal");
    expect(text).toContain("Most error-prone steps");
    for (const code of codes) {
      expect(csv.text).not.toContain(code);
      expect(text).not.toContain(code);
    }
  });

  it("when the period ends before it starts, then the reply is 400 naming the end month", async () => {
    const response = await as(committee).get(`/api/committee/observations?from=${to}&to=${from}`);
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty("to");
  });
});
