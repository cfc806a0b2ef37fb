import { z } from "zod";

import { itemCategories } from "../checklists/categories";
import { severities } from "../calc/verdict";
import { verdicts } from "../calc/verdict";
import { zoneTypes } from "../zones";
import { text, uuidSchema, responseText } from "./common";

/** Fewer audits than this and a site is shown with its interval but not ranked (Lintel's rule). */
export const minimumRankedSample = 30;
/** The longest period one comparison covers. */
export const maxPeriodMonths = 36;

const monthPattern = /^(\d{4})-(0[1-9]|1[0-2])$/;
const month = text().trim().regex(monthPattern, { message: "A month such as 2026-03." });

export const monthsBetween = (from: string, to: string) => {
  const [fy, fm] = from.split("-").map(Number) as [number, number];
  const [ty, tm] = to.split("-").map(Number) as [number, number];
  return (ty - fy) * 12 + (tm - fm) + 1;
};

/** A period of whole months runs forward and is at most `maxPeriodMonths` long. */
function checkPeriod(query: { from: string; to: string }, ctx: z.RefinementCtx) {
  const span = monthsBetween(query.from, query.to);
  if (span < 1)
    ctx.addIssue({ code: "custom", path: ["to"], message: "End on or after the start." });
  else if (span > maxPeriodMonths)
    ctx.addIssue({
      code: "custom",
      path: ["to"],
      message: `At most ${maxPeriodMonths} months at a time.`,
    });
}

/** The period (whole months, on each site's clock) and the zone type a committee view covers. */
export const committeeQuerySchema = z
  .strictObject({
    from: month,
    to: month,
    zoneType: z.enum(zoneTypes, { message: "Choose a zone type." }).optional(),
    siteA: uuidSchema.optional(),
    siteB: uuidSchema.optional(),
  })
  .superRefine(checkPeriod);
/** A period alone (whole months, on each site's clock). */
export const committeePeriodSchema = z
  .strictObject({ from: month, to: month })
  .superRefine(checkPeriod);
export type CommitteeQuery = z.infer<typeof committeeQuerySchema>;

const interval = z.object({ lower: z.number(), upper: z.number() });

export const proportionSchema = z.object({
  n: z.number().int(),
  successes: z.number().int(),
  /** Null when there is nothing to divide by. */
  rate: z.number().nullable(),
  interval: interval.nullable(),
  smallSample: z.boolean(),
});
export type Proportion = z.infer<typeof proportionSchema>;

export const siteComparisonSchema = z.object({
  siteId: uuidSchema,
  siteName: responseText(),
  /** Audits with an "all clear" verdict out of all submitted audits. */
  readiness: proportionSchema,
  verdicts: z.object({
    all_clear: z.number().int(),
    gaps_to_fix: z.number().int(),
    hold: z.number().int(),
  }),
  /** Answers that passed out of those that applied, by item group. */
  categories: z.array(proportionSchema.extend({ category: z.enum(itemCategories) })),
  /** 1 = highest readiness among sites with enough audits; null when too few to rank. */
  rank: z.number().int().nullable(),
});
export type SiteComparison = z.infer<typeof siteComparisonSchema>;

export const comparisonResponseSchema = z.object({
  networkName: responseText(),
  from: responseText(),
  to: responseText(),
  zoneType: z.enum(zoneTypes).nullable(),
  confidence: z.number(),
  minimumRankedSample: z.number().int(),
  network: proportionSchema,
  sites: z.array(siteComparisonSchema),
  difference: z
    .object({
      siteA: uuidSchema,
      siteB: uuidSchema,
      /** Readiness of A minus readiness of B. */
      difference: z.number(),
      interval,
      /** The interval leaves out zero: the sites differ beyond what chance explains. */
      excludesZero: z.boolean(),
    })
    .nullable(),
});
export type ComparisonResponse = z.infer<typeof comparisonResponseSchema>;

export const ageBuckets = ["0-7", "8-30", "31-90", "90+"] as const;
export type AgeBucket = (typeof ageBuckets)[number];
const buckets = z.object({
  "0-7": z.number().int(),
  "8-30": z.number().int(),
  "31-90": z.number().int(),
  "90+": z.number().int(),
});

export const trendsResponseSchema = z.object({
  from: responseText(),
  to: responseText(),
  zoneType: z.enum(zoneTypes).nullable(),
  sites: z.array(
    z.object({
      siteId: uuidSchema,
      siteName: responseText(),
      /** Monthly readiness with 3-sigma limits; months without audits are left out. */
      centre: z.number().nullable(),
      points: z.array(
        z.object({
          month: responseText(),
          audits: z.number().int(),
          allClear: z.number().int(),
          p: z.number(),
          lower: z.number(),
          upper: z.number(),
          outside: z.boolean(),
        }),
      ),
    }),
  ),
  /** Unfinished actions by days since opening, and overdue ones by days past due, now. */
  aging: z.array(
    z.object({
      siteId: uuidSchema,
      siteName: responseText(),
      unfinished: buckets,
      overdue: buckets,
    }),
  ),
  /** Median days from opening to a confirmed fix, for actions done in the period. */
  closeTimes: z.array(
    z.object({
      siteId: uuidSchema,
      siteName: responseText(),
      severity: z.enum(severities),
      closed: z.number().int(),
      medianDays: z.number(),
    }),
  ),
});
export type TrendsResponse = z.infer<typeof trendsResponseSchema>;

export const committeeSiteParamsSchema = z.strictObject({ siteId: uuidSchema });

export const siteDrillDownSchema = z.object({
  siteId: uuidSchema,
  siteName: responseText(),
  from: responseText(),
  to: responseText(),
  spaces: z.array(
    z.object({
      spaceId: uuidSchema,
      spaceName: responseText(),
      zoneType: z.enum(zoneTypes),
      floorId: uuidSchema,
      floorName: responseText(),
      readiness: proportionSchema,
      lastVerdict: z.enum(verdicts).nullable(),
      lastAuditAt: responseText().nullable(),
      unfinishedActions: z.number().int(),
      overdueActions: z.number().int(),
    }),
  ),
});
export type SiteDrillDown = z.infer<typeof siteDrillDownSchema>;
