import { stringify } from "csv-stringify/sync";

import { itemCategoryLabels } from "@shared/checklists/categories";
import { formatInZone } from "@shared/calc/due";
import { verdictLabels } from "@shared/calc/verdict";
import {
  committeePeriodSchema,
  committeeQuerySchema,
  committeeSiteParamsSchema,
} from "@shared/schemas/committee";
import { zoneTypeLabels } from "@shared/zones";

import { notFound } from "../../lib/app-error";
import { asCell, cautionRow, csvPreamble } from "../../lib/csv";
import { atSite, defineRoute, type AnySiteAccess } from "../../lib/routes";
import { requireSite } from "../sites/sites.service";
import { buildMonthlyReport } from "./committee.report";
import { observationCsv } from "./observations.csv";
import { pressureFigures } from "./pressure.service";
import * as committee from "./committee.service";
import { exportAuditRows } from "./committee.repository";

const anyReadableSite: AnySiteAccess = { kind: "any-site", permission: "read:site:site" };

const fixed = (value: number | null | undefined) =>
  value === null || value === undefined ? "" : value.toFixed(4);

const fileStamp = (query: { from: string; to: string }) => `${query.from}-to-${query.to}`;

export const committeeRoutes = [
  defineRoute({
    method: "get",
    path: "/committee/comparison",
    summary:
      "Readiness and compliance by item group per site, with 95% Wilson intervals; a chosen pair's difference with Newcombe's interval",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      res.json(await committee.comparison(deps.db, auth.user.networkId, auth.grants, query));
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/trends",
    summary:
      "Monthly readiness p-charts per site, unfinished and overdue actions by age, median days to close",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      res.json(await committee.trends(deps.db, auth.user.networkId, auth.grants, query));
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/sites/:siteId",
    summary: "One site's spaces: readiness in the period, latest verdict, open and overdue actions",
    access: atSite("read:site:site"),
    params: committeeSiteParamsSchema,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, params, query }) {
      const site = await requireSite(deps.db, auth.user.networkId, params.siteId);
      res.json(await committee.siteDrillDown(deps.db, site.id, site.name, query));
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/comparison/export",
    summary: "The comparison as CSV: one row per site and item group",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      const result = await committee.comparison(deps.db, auth.user.networkId, auth.grants, query);
      const rows: unknown[][] = [];
      for (const site of result.sites) {
        const measures = [
          { measure: "Readiness: all-clear audits out of audits", ...site.readiness },
          ...site.categories.map((c) => ({
            measure: `Compliance: ${itemCategoryLabels[c.category]} items passed out of answered`,
            ...c,
          })),
        ];
        for (const m of measures) {
          rows.push([
            site.siteName,
            m.measure,
            m.successes,
            m.n,
            fixed(m.rate),
            fixed(m.interval?.lower),
            fixed(m.interval?.upper),
            m.smallSample ? "yes" : "no",
            m === measures[0] ? (site.rank ?? "") : "",
          ]);
        }
      }
      const columns = [
        "site",
        "measure",
        "all-clear audits or items passed",
        "audits or items answered",
        "share (0 to 1)",
        "95% interval low (Wilson)",
        "95% interval high (Wilson)",
        `small sample (fewer than ${result.minimumRankedSample})`,
        "rank among sites",
      ];
      const csv = stringify(
        rows.map((row) => row.map(asCell)),
        {
          header: true,
          columns,
        },
      );
      res
        .type("text/csv; charset=utf-8")
        .attachment(`site-comparison-${fileStamp(query)}.csv`)
        .send(`${csvPreamble}${csv}${cautionRow(columns.length)}`);
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/audits/export",
    summary: "The submitted audits behind the comparison as CSV, streamed",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      const sites = await committee.readableSites(deps.db, auth.user.networkId, auth.grants);
      const ids = sites.map((site) => site.id);
      res.type("text/csv; charset=utf-8").attachment(`audits-${fileStamp(query)}.csv`);
      const columns = [
        "audit id",
        "site",
        "floor",
        "space",
        "zone type",
        "auditor",
        "submitted (UTC)",
        "submitted (site time)",
        "verdict",
        "score",
      ];
      res.write(`${csvPreamble}${stringify([columns])}`);
      // One lasting listener: a compressed reply moves listeners onto its own stream, where a
      // `once` per full buffer would pile up for the length of a long export.
      let writable: (() => void) | null = null;
      const wake = () => {
        writable?.();
        writable = null;
      };
      res.on("drain", wake);
      res.on("close", wake);
      await exportAuditRows(deps.db, ids, query, async (page) => {
        const chunk = stringify(
          page.map((row) =>
            [
              row.id,
              row.site_name,
              row.floor_name,
              row.space_name,
              zoneTypeLabels[row.zone_type],
              row.auditor_name,
              row.submitted_at.toISOString(),
              formatInZone(row.submitted_at, row.time_zone),
              verdictLabels[row.verdict],
              fixed(row.score),
            ].map(asCell),
          ),
        );
        if (!res.write(chunk) && !res.destroyed)
          await new Promise<void>((resolve) => {
            writable = resolve;
          });
      });
      res.end(cautionRow(columns.length));
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/report",
    summary: "The monthly committee report as PDF: comparison, charts, overdue actions, cautions",
    access: anyReadableSite,
    query: committeeQuerySchema,
    async handle({ res, deps, auth, query }) {
      const networkId = auth.user.networkId;
      const [comparison, trends, observations, pressure] = await Promise.all([
        committee.comparison(deps.db, networkId, auth.grants, query),
        committee.trends(deps.db, networkId, auth.grants, query),
        committee.observationFigures(deps.db, networkId, auth.grants, query),
        pressureFigures(deps.db, networkId, auth.grants, query),
      ]);
      const sites = await committee.readableSites(deps.db, networkId, auth.grants);
      if (sites.length === 0) throw notFound("A site to report on");
      const overdue = await committee.overdueForReport(
        deps.db,
        sites.map((site) => site.id),
      );
      const pdf = await buildMonthlyReport({
        comparison,
        trends,
        overdue,
        observations,
        pressure,
        generatedAt: new Date(),
      });
      res
        .status(200)
        .type("application/pdf")
        .set("Content-Length", String(pdf.length))
        .attachment(`committee-report-${fileStamp(query)}.pdf`)
        .send(pdf);
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/observations",
    summary:
      "Observed putting-on and removal per site and network: breach rate per step with 95% Wilson intervals, the five most error-prone steps, hand hygiene, observations per month, clean after coaching; cells of fewer than 5 staff codes withheld",
    access: anyReadableSite,
    query: committeePeriodSchema,
    async handle({ res, deps, auth, query }) {
      res.json(
        await committee.observationFigures(deps.db, auth.user.networkId, auth.grants, query),
      );
    },
  }),
  defineRoute({
    method: "get",
    path: "/committee/observations/export",
    summary: "The observation figures as CSV: one row per site (and the network) and measure",
    access: anyReadableSite,
    query: committeePeriodSchema,
    async handle({ res, deps, auth, query }) {
      const figures = await committee.observationFigures(
        deps.db,
        auth.user.networkId,
        auth.grants,
        query,
      );
      res
        .type("text/csv; charset=utf-8")
        .attachment(`observations-${fileStamp(query)}.csv`)
        .send(observationCsv(figures));
    },
  }),
];
