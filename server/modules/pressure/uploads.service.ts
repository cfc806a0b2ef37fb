import { parse as parseCsv } from "csv-parse/sync";
import { inArray } from "drizzle-orm";
import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";

import {
  futureReadingProblem,
  pressureReadingSchema,
  problemsOf,
  type PressureReading,
} from "@shared/schemas/pressure-readings";
import { parsePressureCsv } from "@shared/schemas/pressure-readings-csv";
import type { PressureUploadResult, RefusedReading } from "@shared/schemas/pressure-uploads";

import type { Database } from "../../db/client";
import { pressureMonitors } from "../../db/schema/index";
import { AppError } from "../../lib/app-error";
import type { OnStored } from "./ingest.hook";
import { storeReadings, tally } from "./readings.repository";
import { findActiveTokenByHash, markTokenUsed } from "./upload-tokens.repository";
import { hashUploadToken } from "./upload-tokens.service";

const refusedToken = () =>
  new AppError(
    "unauthenticated",
    401,
    "Send a site's upload token in the Authorization header: Bearer <token>. A revoked token no longer works.",
  );

/** Wrong tokens allowed per client address in 15 minutes before its uploads wait. */
const failedTokenLimit = 30;
const failedTokens = new RateLimiterMemory({ points: failedTokenLimit, duration: 15 * 60 });

/** The site the request's bearer token sends for; 401 for a missing, unknown or revoked token. */
export async function requireUploadSite(
  db: Database,
  authorization: string | undefined,
  address: string,
): Promise<{ tokenId: string; siteId: string }> {
  const spent = await failedTokens.get(address);
  if (spent && spent.consumedPoints >= failedTokenLimit) {
    const seconds = Math.ceil(spent.msBeforeNext / 1000);
    throw new AppError("rate_limited", 429, "Too many wrong upload tokens. Try again later.", {
      retryAfterSeconds: seconds,
    });
  }
  const match = /^Bearer\s+(\S{1,200})\s*$/i.exec(authorization ?? "");
  const token = match ? await findActiveTokenByHash(db, hashUploadToken(match[1]!)) : null;
  if (!token) {
    await failedTokens.penalty(address, 1).catch((error: unknown) => {
      if (!(error instanceof RateLimiterRes)) throw error;
    });
    throw refusedToken();
  }
  return { tokenId: token.id, siteId: token.siteId };
}

interface Candidate {
  reading: PressureReading;
  where: { index?: number; line?: number };
  /** How the batch names the monitor field: `readings.3.monitorId` or `monitor_id`. */
  monitorField: string;
  measuredField: string;
}

/**
 * Stores an upload's good readings and names every refused one with its field. An upload with
 * nothing to store (every reading refused, or a CSV whose header is wrong) is refused whole with
 * 422, and then nothing is written — not even the token's last use.
 */
export async function storeUpload(
  db: Database,
  upload: { tokenId: string; siteId: string },
  body: { readings?: unknown[]; csv?: string },
  options: { now: Date; onStored?: OnStored },
): Promise<PressureUploadResult> {
  const { now } = options;
  const refused: RefusedReading[] = [];
  const candidates: Candidate[] = [];
  let received: number;

  if (body.csv !== undefined) {
    const parsed = parsePressureCsv(body.csv);
    const header = parsed.problems.filter(
      (problem) => problem.line === 1 || problem.field === "file",
    );
    if (header.length > 0)
      throw wholeRefusal(header.map((p) => [`line ${p.line}.${p.field}`, p.message]));
    for (const problem of parsed.problems)
      refused.push({
        line: problem.line,
        field: problem.field,
        message: problem.message,
        reason: "invalid",
      });
    // The CSV parser gives the good readings in file order; their lines are the ones not refused.
    const refusedLines = new Set(parsed.problems.map((problem) => problem.line));
    const lines = csvRowLines(body.csv).filter((line) => !refusedLines.has(line));
    parsed.readings.forEach((reading, position) =>
      candidates.push({
        reading,
        where: { line: lines[position] },
        monitorField: "monitor_id",
        measuredField: "measured_at",
      }),
    );
    received = parsed.readings.length + refusedLines.size;
  } else {
    const readings = body.readings ?? [];
    received = readings.length;
    readings.forEach((raw, index) => {
      const parsed = pressureReadingSchema.safeParse(raw);
      if (!parsed.success) {
        for (const problem of problemsOf(parsed.error, (key) => key))
          refused.push({
            index,
            field: problem.field ? `readings.${index}.${problem.field}` : `readings.${index}`,
            message: problem.message,
            reason: "invalid",
          });
        return;
      }
      candidates.push({
        reading: parsed.data,
        where: { index },
        monitorField: `readings.${index}.monitorId`,
        measuredField: `readings.${index}.measuredAt`,
      });
    });
  }

  // A monitor mapped to another site takes readings only with that site's token.
  const monitorIds = [...new Set(candidates.map((c) => c.reading.monitorId))];
  const mapped =
    monitorIds.length === 0
      ? []
      : await db
          .select({ monitorId: pressureMonitors.monitorId, siteId: pressureMonitors.siteId })
          .from(pressureMonitors)
          .where(inArray(pressureMonitors.monitorId, monitorIds));
  const elsewhere = new Set(
    mapped.filter((row) => row.siteId !== upload.siteId).map((row) => row.monitorId),
  );
  const accepted: PressureReading[] = [];
  let future = 0;
  let wrongSite = 0;
  for (const candidate of candidates) {
    if (elsewhere.has(candidate.reading.monitorId)) {
      wrongSite += 1;
      refused.push({
        ...candidate.where,
        field: candidate.monitorField,
        message: "This monitor belongs to another site: send its readings with that site's token.",
        reason: "wrong_site",
      });
      continue;
    }
    const tooEarly = futureReadingProblem(candidate.reading.measuredAt, now);
    if (tooEarly) {
      future += 1;
      refused.push({
        ...candidate.where,
        field: candidate.measuredField,
        message: tooEarly.message,
        reason: "future",
      });
      continue;
    }
    accepted.push(candidate.reading);
  }
  refused.sort((a, b) => (a.index ?? a.line ?? 0) - (b.index ?? b.line ?? 0));

  if (accepted.length === 0)
    throw wholeRefusal(
      refused.map((r) => [r.line !== undefined ? `line ${r.line}.${r.field}` : r.field, r.message]),
    );

  const outcome = await storeReadings(db, accepted, { source: "upload", now });
  await tally(
    db,
    { source: "upload", now },
    {
      invalid: refused.filter((r) => r.reason === "invalid").length,
      future,
      wrong_site: wrongSite,
    },
  );
  await markTokenUsed(db, upload.tokenId, now);
  if (outcome.inserted.length > 0) await options.onStored?.(outcome.inserted, now);
  return { received, stored: outcome.stored, duplicates: outcome.duplicates, refused };
}

/** The 422 for an upload with nothing to store, naming (up to 100) fields at fault. */
function wholeRefusal(problems: [string, string][]): AppError {
  const fields = new Map<string, string>();
  for (const [field, message] of problems.slice(0, 100))
    if (!fields.has(field)) fields.set(field, message);
  return new AppError(
    "validation_failed",
    422,
    `Nothing in this upload could be stored. Check these fields: ${[...fields.keys()].slice(0, 10).join(", ")}.`,
    { fields: Object.fromEntries(fields) },
  );
}

/**
 * The line each data row of a CSV starts on, counted as the CSV parser counts them (its last
 * line less the line breaks inside quoted cells), header excluded.
 */
function csvRowLines(csv: string): number[] {
  const records = parseCsv(csv.replace(/\r\n?/g, "\n"), {
    bom: true,
    info: true,
    relax_column_count: true,
    skip_empty_lines: true,
    max_record_size: 10_000,
  }) as unknown as { record: string[]; info: { lines: number } }[];
  return records
    .slice(1)
    .map(
      (entry) =>
        entry.info.lines -
        entry.record.reduce((sum, cell) => sum + (cell.split("\n").length - 1), 0),
    );
}
