import { randomUUID } from "node:crypto";

import { and, asc, eq, inArray, ne, notExists } from "drizzle-orm";
import sharp from "sharp";

import { defaultDuePolicy } from "@shared/calc/due";
import { polygonCentroid } from "@shared/calc/plan-geometry";
import { actionStates, type ActionState } from "@shared/workflow/action-workflow";

import type { Tx } from "../db/client";
import {
  actionNotices,
  actionProofs,
  auditAnswers,
  audits,
  changeLog,
  checklistItems,
  correctiveActions,
  findings,
  floors,
  siteDuePolicies,
  sites,
  spaces,
} from "../db/schema/index";
import { storeImage } from "../lib/images";
import type { Storage } from "../lib/storage";
import { peopleWithRoleAt } from "../modules/actions/actions.repository";
import {
  demoPaces,
  demoReopenAt,
  demoStorySeed,
  tellStories,
  type StoryChain,
  type StoryFailure,
} from "./action-stories";
import type { DemoSiteKey } from "./people";
import { proofPictures } from "./proof-pictures";

const entity = "corrective_action";
const requestId = "demo-data";

/** Where a chain's actions sit: its site, space and floor, and the space's middle on the plan. */
interface Place {
  siteKey: DemoSiteKey;
  siteId: string;
  spaceId: string;
  floorId: string;
  position: { x: number; y: number };
}

/**
 * The failed answers of the demo's submitted audits that the live system has not seen yet, as
 * chains (one item in one space, oldest first), with where each chain's actions belong.
 */
async function readDemoChains(
  tx: Tx,
  siteIds: Record<DemoSiteKey, string>,
): Promise<{
  chains: StoryChain[];
  places: Map<string, Place>;
  leads: Map<string, string | null>;
}> {
  const siteKeys = Object.keys(siteIds) as DemoSiteKey[];
  const siteRows = await tx
    .select({ id: sites.id, timeZone: sites.timeZone, policy: siteDuePolicies.policy })
    .from(sites)
    .leftJoin(siteDuePolicies, eq(siteDuePolicies.siteId, sites.id))
    .where(inArray(sites.id, Object.values(siteIds)));
  const people = new Map<string, { lead: string | null; auditors: string[] }>();
  for (const key of siteKeys) {
    const [lead] = await peopleWithRoleAt(tx, siteIds[key], "facilities_lead");
    const auditors = await peopleWithRoleAt(tx, siteIds[key], "auditor");
    people.set(siteIds[key], { lead: lead?.id ?? null, auditors: auditors.map((a) => a.id) });
  }

  // Audits that already have findings were seen by the live system; leave them be.
  const failed = await tx
    .select({
      auditId: audits.id,
      auditorId: audits.auditorId,
      submittedAt: audits.submittedAt,
      siteId: audits.siteId,
      spaceId: audits.spaceId,
      floorId: spaces.floorId,
      level: floors.level,
      spaceName: spaces.name,
      polygon: spaces.polygon,
      itemId: checklistItems.id,
      itemKey: checklistItems.key,
      itemText: checklistItems.text,
      severity: checklistItems.severity,
      note: auditAnswers.note,
    })
    .from(auditAnswers)
    .innerJoin(audits, eq(audits.id, auditAnswers.auditId))
    .innerJoin(checklistItems, eq(checklistItems.id, auditAnswers.itemId))
    .innerJoin(spaces, eq(spaces.id, audits.spaceId))
    .innerJoin(floors, eq(floors.id, spaces.floorId))
    .where(
      and(
        inArray(audits.siteId, Object.values(siteIds)),
        eq(audits.status, "submitted"),
        eq(auditAnswers.outcome, "fail"),
        notExists(
          tx.select({ id: findings.id }).from(findings).where(eq(findings.auditId, audits.id)),
        ),
      ),
    )
    .orderBy(asc(audits.submittedAt), asc(checklistItems.position));
  const liveUnfinished = new Set(
    (
      await tx
        .select({ spaceId: correctiveActions.spaceId, itemKey: correctiveActions.itemKey })
        .from(correctiveActions)
        .where(
          and(
            inArray(correctiveActions.siteId, Object.values(siteIds)),
            ne(correctiveActions.state, "done"),
          ),
        )
    ).map((row) => `${row.spaceId}|${row.itemKey}`),
  );

  const chainsByKey = new Map<string, StoryChain & { failures: StoryFailure[] }>();
  const places = new Map<string, Place>();
  for (const row of failed) {
    if (!row.submittedAt) continue;
    const siteKey = siteKeys.find((key) => siteIds[key] === row.siteId)!;
    const key = `${siteKey}|${row.level}|${row.spaceName}|${row.itemKey}`;
    let chain = chainsByKey.get(key);
    if (!chain) {
      const site = siteRows.find((s) => s.id === row.siteId)!;
      const who = people.get(row.siteId)!;
      chain = {
        key,
        site: siteKey,
        timeZone: site.timeZone,
        policy: site.policy ?? defaultDuePolicy,
        leadId: who.lead,
        auditorIds: who.auditors,
        failures: [],
        mustEndDone: liveUnfinished.has(`${row.spaceId}|${row.itemKey}`),
      };
      chainsByKey.set(key, chain);
      places.set(key, {
        siteKey,
        siteId: row.siteId,
        spaceId: row.spaceId,
        floorId: row.floorId,
        position: polygonCentroid(row.polygon),
      });
    }
    chain.failures.push({
      auditId: row.auditId,
      auditorId: row.auditorId,
      at: row.submittedAt.getTime(),
      itemId: row.itemId,
      itemKey: row.itemKey,
      itemText: row.itemText,
      severity: row.severity,
      note: row.note,
    });
  }
  const leads = new Map([...people].map(([siteId, who]) => [siteId, who.lead]));
  return { chains: [...chainsByKey.values()], places, leads };
}

/**
 * Findings and corrective actions for the demo audit history, as the live system would have made
 * them when each audit was submitted, then a year of work on them by the facilities leads and
 * auditors (told by action-stories.ts, every move through the workflow table), with the proof
 * photos stored for each site. Returns counts by site and state.
 */
export async function createDemoCorrectiveActions(
  tx: Tx,
  storage: Storage,
  siteIds: Record<DemoSiteKey, string>,
  now = new Date(),
): Promise<Record<string, Record<ActionState, number>>> {
  const nowMs = now.getTime();
  const siteKeys = Object.keys(siteIds) as DemoSiteKey[];
  const { chains, places, leads } = await readDemoChains(tx, siteIds);
  const stories = tellStories({
    chains,
    now: nowMs,
    paces: demoPaces,
    seed: demoStorySeed,
    reopenAt: demoReopenAt,
  });

  const pictures = await Promise.all(
    proofPictures().map((svg) => sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer()),
  );
  const pictureIds = new Map<string, string[]>();
  for (const key of siteKeys) {
    const ids: string[] = [];
    for (const buffer of pictures) {
      const image = await storeImage(
        { db: tx, storage },
        { siteId: siteIds[key], uploadedBy: leads.get(siteIds[key])!, buffer, field: "photo" },
      );
      ids.push(image.id);
    }
    pictureIds.set(siteIds[key], ids);
  }

  const actionRows: (typeof correctiveActions.$inferInsert)[] = [];
  const findingRows: (typeof findings.$inferInsert)[] = [];
  const proofRows: (typeof actionProofs.$inferInsert)[] = [];
  const logRows: (typeof changeLog.$inferInsert)[] = [];
  const noticeRows: (typeof actionNotices.$inferInsert)[] = [];
  const counts = Object.fromEntries(
    siteKeys.map((key) => [
      key,
      Object.fromEntries(actionStates.map((state) => [state, 0])) as Record<ActionState, number>,
    ]),
  );
  for (const { chain, actions } of stories) {
    const place = places.get(chain.key)!;
    const images = pictureIds.get(place.siteId)!;
    for (const action of actions) {
      const actionId = randomUUID();
      counts[place.siteKey]![action.state] += 1;
      actionRows.push({
        id: actionId,
        siteId: place.siteId,
        spaceId: place.spaceId,
        floorId: place.floorId,
        itemKey: action.itemKey,
        title: action.title,
        severity: action.severity,
        state: action.state,
        assigneeId: chain.leadId,
        openedAt: new Date(action.openedAt),
        dueAt: new Date(action.dueAt),
        closedAt: action.closedAt === null ? null : new Date(action.closedAt),
        closeReason: action.closedAt === null ? null : "confirmed",
        daysToClose: action.daysToClose,
        proofRound: action.proofRound,
        ...place.position,
        createdAt: new Date(action.openedAt),
        updatedAt: new Date(action.updatedAt),
      });
      for (const finding of action.findings)
        findingRows.push({
          id: randomUUID(),
          actionId,
          auditId: finding.auditId,
          siteId: place.siteId,
          spaceId: place.spaceId,
          itemId: finding.itemId,
          itemKey: finding.itemKey,
          itemText: finding.itemText,
          severity: finding.severity,
          note: finding.note,
          ...place.position,
          createdAt: new Date(finding.at),
        });
      const proofIds = action.proofs.map(() => randomUUID());
      action.proofs.forEach((proof, index) =>
        proofRows.push({
          id: proofIds[index]!,
          actionId,
          imageId: images[proof.picture]!,
          round: proof.round,
          uploadedBy: chain.leadId,
          createdAt: new Date(proof.at),
        }),
      );
      for (const entry of action.log) {
        let after = entry.after;
        if ("proof" in after) {
          const { proof, picture, ...rest } = after;
          after = {
            ...rest,
            proofId: proofIds[proof as number],
            imageId: images[picture as number],
          };
        }
        logRows.push({
          occurredAt: new Date(entry.at),
          actorId: entry.actorId,
          action: `action.${entry.kind}`,
          entity,
          entityId: actionId,
          siteId: place.siteId,
          before: entry.before ?? null,
          after,
          reason: entry.reason ?? null,
          requestId,
        });
      }
      for (const notice of action.notices)
        noticeRows.push({ actionId, kind: notice.kind, createdAt: new Date(notice.at) });
    }
  }

  const insertAll = async <T>(
    rows: T[],
    size: number,
    insert: (batch: T[]) => Promise<unknown>,
  ) => {
    for (let i = 0; i < rows.length; i += size) await insert(rows.slice(i, i + size));
  };
  await insertAll(actionRows, 500, (batch) => tx.insert(correctiveActions).values(batch));
  await insertAll(findingRows, 500, (batch) => tx.insert(findings).values(batch));
  await insertAll(proofRows, 1000, (batch) => tx.insert(actionProofs).values(batch));
  await insertAll(logRows, 1000, (batch) => tx.insert(changeLog).values(batch));
  await insertAll(noticeRows, 1000, (batch) => tx.insert(actionNotices).values(batch));
  return counts;
}
