import { type CommitteeQuery, committeeQuerySchema } from "@shared/schemas/committee";
import { uuidSchema } from "@shared/schemas/common";
import { type ZoneType, zoneTypes } from "@shared/zones";

/** What the committee page shows: the period, the zone type and the pair of sites compared. */
export type CommitteeView = CommitteeQuery;
/** The part of the view that the trends and a site's spaces depend on. */
export type CommitteePeriod = Omit<CommitteeQuery, "siteA" | "siteB">;

const monthPattern = /^\d{4}-(0[1-9]|1[0-2])$/;

export function isMonth(value: string | null | undefined): value is string {
  return typeof value === "string" && monthPattern.test(value);
}

/** The reader's own calendar month, "YYYY-MM". */
export function monthOf(date: Date): string {
  return `${date.getFullYear()}-${String(date.getMonth() + 1).padStart(2, "0")}`;
}

export function addMonths(month: string, delta: number): string {
  const [year, monthNumber] = month.split("-").map(Number) as [number, number];
  const index = year * 12 + (monthNumber - 1) + delta;
  return `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, "0")}`;
}

/** The last twelve months up to and including this one. */
export function defaultPeriod(now: Date = new Date()): { from: string; to: string } {
  const to = monthOf(now);
  return { from: addMonths(to, -11), to };
}

const isZoneType = (value: string | null): value is ZoneType =>
  value !== null && (zoneTypes as readonly string[]).includes(value);
const siteIdOf = (value: string | null) =>
  value !== null && uuidSchema.safeParse(value).success ? value : undefined;

/** The view a page address asks for; anything missing or unreadable falls back to the default. */
export function viewFromSearch(search: URLSearchParams, now: Date = new Date()): CommitteeView {
  const fallback = defaultPeriod(now);
  const from = search.get("from");
  const to = search.get("to");
  const zoneType = search.get("zoneType");
  const view: CommitteeView = {
    from: isMonth(from) ? from : fallback.from,
    to: isMonth(to) ? to : fallback.to,
  };
  if (isZoneType(zoneType)) view.zoneType = zoneType;
  const siteA = siteIdOf(search.get("siteA"));
  const siteB = siteIdOf(search.get("siteB"));
  if (siteA) view.siteA = siteA;
  if (siteB) view.siteB = siteB;
  return view;
}

/** What is wrong with the view, by field, in the server's own words. */
export function viewErrors(view: CommitteeView): Partial<Record<keyof CommitteeView, string>> {
  const parsed = committeeQuerySchema.safeParse(view);
  if (parsed.success) return {};
  const errors: Partial<Record<keyof CommitteeView, string>> = {};
  for (const issue of parsed.error.issues) {
    const field = issue.path[0] as keyof CommitteeView | undefined;
    if (field && !errors[field]) errors[field] = issue.message;
  }
  return errors;
}

export function periodOf(view: CommitteeView): CommitteePeriod {
  const period: CommitteePeriod = { from: view.from, to: view.to };
  if (view.zoneType) period.zoneType = view.zoneType;
  return period;
}

/** The view as search parameters, in a fixed order so equal views make equal links. */
export function viewToSearch(view: Partial<CommitteeView>): URLSearchParams {
  const search = new URLSearchParams();
  for (const name of ["from", "to", "zoneType", "siteA", "siteB"] as const) {
    const value = view[name];
    if (value) search.set(name, value);
  }
  return search;
}

/** "?from=…&to=…" for an API path; empty when there is nothing to send. */
export function apiSearch(view: Partial<CommitteeView>): string {
  const text = viewToSearch(view).toString();
  return text ? `?${text}` : "";
}
