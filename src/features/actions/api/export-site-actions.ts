import { actionFilterSearch, type SiteActionFilters } from "./get-site-actions";

/** The CSV download of the same list; a plain link, so the browser saves the file itself. */
export function siteActionsExportHref(siteId: string, filters: SiteActionFilters = {}): string {
  return `/api/sites/${encodeURIComponent(siteId)}/actions/export${actionFilterSearch(filters)}`;
}
