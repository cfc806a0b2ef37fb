import { can } from "@shared/permissions";
import type { MeResponse } from "@shared/schemas/auth";
import type { ChecklistsResponse } from "@shared/schemas/checklists";
import type { FloorDetail } from "@shared/schemas/floors";
import {
  dehydrate,
  hydrate,
  onlineManager,
  type Query,
  type QueryClient,
  type QueryKey,
} from "@tanstack/react-query";

import { checklistsQueryOptions } from "@/features/admin/api/get-checklists";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { floorQueryOptions } from "@/features/floor-plans/api/get-floor";
import { floorsQueryOptions } from "@/features/floor-plans/api/get-floors";
import { siteQueryOptions } from "@/features/sites/api/get-site";
import { sitesQueryOptions } from "@/features/sites/api/get-sites";
import { myDueQueryOptions } from "@/features/walkthroughs/api/get-my-due";
import { sequencesQueryOptions } from "@/features/admin/api/get-sequences";
import { siteScheduleQueryOptions } from "@/features/walkthroughs/api/get-site-schedule";
import {
  hasKeptStorage,
  type KeptImage,
  keepImages,
  keptImageIds,
  keptSummary,
  type KeptSummary,
  readKeptQueries,
  saveKeptQueries,
} from "@/lib/kept-store";

// Reached through this module, which every signed-in page has loaded by then: a file of its own
// could still be on the server when the signal goes.
export { askForPersistentStorage } from "@/lib/kept-store";
import { canAnywhere } from "@/lib/authorization";
import { phonePersonId } from "@/lib/phone-person";
import { planImageUrl as planUrl } from "@/lib/use-plan-image";

/**
 * What an auditor needs with no signal, kept in their own store on the phone after an online
 * sign-in and again, at most every few minutes, while the app is online: their due list, their
 * sites' due lists, floors and spaces, the published checklists, the sequences for observing
 * putting on and removal, and the floor plans at the size
 * the phone shows them. Bounded so a large network cannot fill the phone.
 */
export const keptLimits = {
  sites: 12,
  floorsPerSite: 30,
  images: 60,
  imageBytes: 40 * 1024 * 1024,
  everyMs: 5 * 60_000,
};

const lastKept = new Map<string, number>();
let running: Promise<KeptSummary | null> | null = null;

async function fetchImage(imageId: string): Promise<Blob | null> {
  try {
    const response = await fetch(planUrl(imageId), { credentials: "same-origin" });
    return response.ok ? await response.blob() : null;
  } catch {
    return null;
  }
}

/**
 * Loads the pages an auditor opens with no signal (site, due list, floor, audit, account), so the
 * page in hand can open them offline; the service worker keeps the same files for the next visit.
 */
function loadAuditingPages(): Promise<unknown> {
  return Promise.all([
    import("./routes/site"),
    import("./routes/site-due"),
    import("./routes/floor"),
    import("@/features/floor-plans/components/floor-map"),
    import("./routes/audit-layout"),
    import("./routes/start-audit"),
    import("./routes/observe"),
    import("./routes/audit"),
    import("./routes/account"),
  ]);
}

async function keepNow(queryClient: QueryClient, me: MeResponse): Promise<KeptSummary | null> {
  const personId = me.user.id;
  await loadAuditingPages().catch(() => undefined);
  const fresh = { staleTime: 60_000 };
  const keys: QueryKey[] = [meQueryOptions().queryKey];
  const fetchKept = async <T>(options: { queryKey: QueryKey } & object): Promise<T> => {
    keys.push(options.queryKey);
    return (await queryClient.fetchQuery({ ...options, ...fresh } as never)) as T;
  };

  await fetchKept(myDueQueryOptions());
  await fetchKept<ChecklistsResponse>(checklistsQueryOptions());
  // Lintel before observations answers 404 here: audits are still kept.
  await fetchKept(sequencesQueryOptions()).catch(() => undefined);
  const sites = (await fetchKept<{ id: string }[]>(sitesQueryOptions()))
    .filter((site) => can(me.roles, "conduct:audit:site", site.id))
    .slice(0, keptLimits.sites);
  const plans: string[] = [];
  for (const site of sites) {
    await fetchKept(siteQueryOptions(site.id));
    await fetchKept(siteScheduleQueryOptions(site.id));
    const floors = await fetchKept<{ id: string }[]>(floorsQueryOptions(site.id));
    for (const floor of floors.slice(0, keptLimits.floorsPerSite)) {
      const detail = await fetchKept<FloorDetail>(floorQueryOptions(floor.id));
      if (detail.floor.plan) plans.push(detail.floor.plan.imageId);
    }
  }

  const now = new Date();

  // Plan images never change under their id: fetch only the ones not kept yet.
  const have = new Set(await keptImageIds(personId));
  const keep = new Set<string>();
  const added: KeptImage[] = [];
  let bytes = 0;
  for (const imageId of plans.slice(0, keptLimits.images)) {
    if (have.has(imageId)) {
      keep.add(imageId);
      continue;
    }
    const blob = await fetchImage(imageId);
    if (!blob || bytes + blob.size > keptLimits.imageBytes) continue;
    bytes += blob.size;
    keep.add(imageId);
    added.push({ imageId, blob, bytes: blob.size, keptAt: now.toISOString() });
  }
  await keepImages(personId, added, keep);

  // Written last: when it says when Lintel last answered, everything above is kept.
  const wanted = new Set(keys.map((key) => JSON.stringify(key)));
  const state = dehydrate(queryClient, {
    shouldDehydrateQuery: (query: Query) =>
      query.state.status === "success" && wanted.has(JSON.stringify(query.queryKey)),
  });
  await saveKeptQueries(personId, state, now);
  lastKept.set(personId, Date.now());
  return keptSummary(personId);
}

/**
 * Refreshes what the phone keeps for the signed-in auditor; at most every few minutes unless
 * `force` (after a sign-in or a submitted audit). Failures wait for the next chance.
 */
export function keepForOffline(
  queryClient: QueryClient,
  me: MeResponse,
  { force = false }: { force?: boolean } = {},
): Promise<KeptSummary | null> {
  if (!hasKeptStorage() || !onlineManager.isOnline()) return Promise.resolve(null);
  if (!canAnywhere(me.roles, "conduct:audit:site")) return Promise.resolve(null);
  const last = lastKept.get(me.user.id) ?? 0;
  if (!force && Date.now() - last < keptLimits.everyMs) return Promise.resolve(null);
  running ??= keepNow(queryClient, me)
    .catch(() => null)
    .finally(() => {
      running = null;
    });
  return running;
}

const restored = new Map<string, Promise<void>>();

/**
 * Puts what the phone keeps for its person into the query cache, once per page: lists the cache
 * already holds newer are left as they are. Pages then open from it with no signal, and say when
 * Lintel last answered.
 */
export function restoreKept(queryClient: QueryClient): Promise<void> {
  const personId = phonePersonId();
  if (!personId || !hasKeptStorage()) return Promise.resolve();
  let restoring = restored.get(personId);
  if (!restoring) {
    restoring = readKeptQueries(personId)
      .then((kept) => {
        if (kept && phonePersonId() === personId) hydrate(queryClient, kept.state);
      })
      .catch(() => undefined);
    restored.set(personId, restoring);
  }
  return restoring;
}

/** Forgets that the page restored a person's kept data (they signed out). */
export function forgetRestored(personId: string): void {
  restored.delete(personId);
  lastKept.delete(personId);
}
