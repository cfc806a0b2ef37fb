import os from "node:os";

import sharp from "sharp";

import { demoPassword } from "../server/demo/people";
import { processImage } from "../server/lib/images";
import type { Cluster } from "./lib/postgres";
import { benchDatabase, runBenchAlone, startBenchServer } from "./lib/bench-standalone";
import { benchCommittee } from "./bench-committee";
import { benchPhone } from "./bench-phone";
import { benchPressureChart } from "./bench-pressure-chart";
import { benchPressureIngest } from "./bench-pressure-ingest";
import { clientBundleReport } from "./lib/bundle-size";
import { fixedCostLine, measureFixedCost } from "./lib/fixed-cost";

/**
 * `npm run bench`: numbers, not assertions. API latency and throughput against a throwaway
 * PostgreSQL with the demo network, audit submission under concurrent auditors, the photo pipeline
 * beside bare sharp, and what the audit screens download first. Compare runs on one machine only.
 */
const requests = Number(process.env.BENCH_REQUESTS ?? 1000);

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

function row(label: string, count: number, parallel: number, times: number[], seconds: number) {
  times.sort((a, b) => a - b);
  const cells = [percentile(times, 50), percentile(times, 95), percentile(times, 99)].map((ms) =>
    ms.toFixed(1).padStart(8),
  );
  console.log(
    [
      label.padEnd(40),
      String(count).padStart(6),
      String(parallel).padStart(5),
      ...cells,
      (count / seconds).toFixed(0).padStart(8),
    ].join(" "),
  );
}

/** Runs `count` calls over `parallel` connections; each call returns the elapsed milliseconds. */
async function measure(
  label: string,
  count: number,
  parallel: number,
  call: (index: number) => Promise<number>,
) {
  const times: number[] = [];
  let next = 0;
  const started = performance.now();
  await Promise.all(
    Array.from({ length: parallel }, async () => {
      while (next < count) {
        const index = next++;
        times.push(await call(index));
      }
    }),
  );
  row(label, count, parallel, times, (performance.now() - started) / 1000);
}

async function timed(request: () => Promise<Response>, label: string): Promise<number> {
  const t0 = performance.now();
  const response = await request();
  await response.arrayBuffer();
  if (!response.ok) throw new Error(`${label}: HTTP ${response.status}`);
  return performance.now() - t0;
}

async function benchAll(cluster: Cluster, s3Endpoint: string) {
  const url = await benchDatabase(cluster, "lintel_bench");
  const server = await startBenchServer(url, s3Endpoint, { LINTEL_DEMO: "1" });
  try {
    const origin = server.url;
    const signIn = () =>
      fetch(`${origin}/api/auth/sign-in`, {
        method: "POST",
        headers: { "content-type": "application/json", origin },
        body: JSON.stringify({ email: "auditor@example.org", password: demoPassword }),
      });
    const cookie = (await signIn()).headers.getSetCookie()[0]!.split(";")[0]!;
    const headers = { cookie, origin, "content-type": "application/json" };
    const get = (route: string) => () =>
      timed(() => fetch(`${origin}${route}`, { headers }), route);

    console.log(
      `Lintel benchmark — ${os.cpus().length} CPUs, Node ${process.version}; times in ms`,
    );
    console.log(
      [
        "what".padEnd(40),
        "n".padStart(6),
        "conc".padStart(5),
        "p50".padStart(8),
        "p95".padStart(8),
        "p99".padStart(8),
        "per s".padStart(8),
      ].join(" "),
    );
    await measure("GET /api/health (warm-up)", 200, 10, get("/api/health"));
    await measure("GET /api/auth/me", requests, 50, get("/api/auth/me"));
    await measure("GET /api/sites", requests, 50, get("/api/sites"));
    await measure("POST /api/auth/sign-in (argon2id)", 40, 2, () => timed(signIn, "sign-in"));
    console.log(
      `\n${fixedCostLine(await measureFixedCost(origin, cookie, Number(process.env.BENCH_FIXED_COST_REQUESTS ?? 2000)))}\n`,
    );

    // Audit submission: 25-item checklist, answers saved beforehand, only the submit is timed.
    const sites = (await (await fetch(`${origin}/api/sites`, { headers })).json()) as {
      sites: { id: string }[];
    };
    const siteId = sites.sites[0]!.id;
    const floors = (await (
      await fetch(`${origin}/api/sites/${siteId}/floors`, { headers })
    ).json()) as { floors: { id: string }[] };
    const floor = (await (
      await fetch(`${origin}/api/floors/${floors.floors[0]!.id}`, { headers })
    ).json()) as { spaces: { id: string; zoneType: string }[] };
    const donning = floor.spaces.filter(
      (space: { zoneType: string }) => space.zoneType === "donning_zone",
    );
    const admin = (
      await fetch(`${origin}/api/auth/sign-in`, {
        method: "POST",
        headers: { "content-type": "application/json", origin },
        body: JSON.stringify({ email: "admin@example.org", password: demoPassword }),
      })
    ).headers
      .getSetCookie()[0]!
      .split(";")[0]!;
    const items = Array.from({ length: 25 }, (_, n) => ({
      text: `Bench item ${n + 1}`,
      severity: n % 5 === 0 ? "critical" : n % 2 ? "major" : "minor",
      response: "check",
      photoOnFail: false,
    }));
    await fetch(`${origin}/api/checklists/donning_zone/draft`, {
      method: "PUT",
      headers: { ...headers, cookie: admin },
      body: JSON.stringify({ title: "Bench", items }),
    });
    await fetch(`${origin}/api/checklists/donning_zone/publish`, {
      method: "POST",
      headers: { ...headers, cookie: admin },
    });
    const submissions = 200;
    const auditIds: string[] = [];
    for (let n = 0; n < submissions; n += 1) {
      const auditId = crypto.randomUUID();
      const started = (await (
        await fetch(`${origin}/api/audits/${auditId}`, {
          method: "PUT",
          headers,
          body: JSON.stringify({
            spaceId: donning[n % donning.length]!.id,
            startedAt: new Date().toISOString(),
          }),
        })
      ).json()) as { items: { id: string }[] };
      await Promise.all(
        started.items.map((item: { id: string }) =>
          fetch(`${origin}/api/audits/${auditId}/answers/${item.id}`, {
            method: "PUT",
            headers,
            body: JSON.stringify({ id: crypto.randomUUID(), outcome: "pass" }),
          }).then((r) => r.arrayBuffer()),
        ),
      );
      auditIds.push(auditId);
    }
    await measure("POST /api/audits/:id/submit (25 items)", submissions, 20, (index) =>
      timed(
        () => fetch(`${origin}/api/audits/${auditIds[index]}/submit`, { method: "POST", headers }),
        "submit",
      ),
    );

    // Photo pipeline: a 12-megapixel JPEG through our code beside bare sharp making the same outputs.
    const photo = await sharp({
      create: {
        width: 4000,
        height: 3000,
        channels: 3,
        background: "#808080",
        noise: { type: "gaussian", mean: 128, sigma: 40 },
      },
    })
      .jpeg({ quality: 88 })
      .toBuffer();
    const bare = async () => {
      const display = await sharp(photo)
        .rotate()
        .resize({ width: 2400, height: 2400, fit: "inside", withoutEnlargement: true })
        .webp({ quality: 85 })
        .toBuffer();
      await sharp(display)
        .resize({ width: 400, height: 400, fit: "inside", withoutEnlargement: true })
        .webp({ quality: 75 })
        .toBuffer();
    };
    const ours = () => processImage(photo, { field: "photo", maxSide: 2400 });
    await bare();
    await ours();
    const runs = 6;
    const time = async (work: () => Promise<unknown>) => {
      const times: number[] = [];
      for (let n = 0; n < runs; n += 1) {
        const t0 = performance.now();
        await work();
        times.push(performance.now() - t0);
      }
      return times.sort((a, b) => a - b)[Math.floor(runs / 2)]!;
    };
    const bareMs = await time(bare);
    const oursMs = await time(ours);
    console.log(
      `\nPhoto pipeline, 12 MP JPEG (${(photo.length / 1024 / 1024).toFixed(1)} MB), median of ${runs}:`,
    );
    console.log(
      `  bare sharp ${bareMs.toFixed(0)} ms · Lintel pipeline (storage aside) ${oursMs.toFixed(0)} ms · ratio ${(oursMs / bareMs).toFixed(2)}× (target ≤ 1.3×)`,
    );

    console.log("\nJavaScript the screens load first (gzip):");
    for (const line of await clientBundleReport()) console.log(`  ${line}`);

    console.log("\nCommittee view at network scale:");
    await benchCommittee(cluster, s3Endpoint);
    await benchPhone(cluster, s3Endpoint);
    console.log("\nLive room pressure, ingestion through the broker:");
    await benchPressureIngest(cluster);
    console.log("\nLive room pressure, a room's charts at 500 monitors:");
    await benchPressureChart(cluster, s3Endpoint);
  } finally {
    await server.close();
  }
}

void runBenchAlone("all", benchAll);
