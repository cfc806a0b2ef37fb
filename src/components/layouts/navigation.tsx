import type { Permission } from "@shared/permissions";
import type { ReactNode } from "react";
import { Link, matchPath, useLocation } from "react-router-dom";

import { useAuthorization } from "@/lib/authorization";
import { cn } from "@/lib/cn";

export interface NavigationItem {
  label: string;
  to: string;
  icon: ReactNode;
  /** Hidden unless the person holds this permission at one site at least. */
  permission?: Permission;
  /** Active only on an exact match (for the home entry). */
  end?: boolean;
  /** Further path patterns that count as this entry, e.g. a site page for "Sites". */
  alsoActiveOn?: readonly string[];
  /**
   * Only in the phone's bottom bar, or only in the side rail: the bar holds five entries at most,
   * so rarer pages gather behind one entry there while the rail, which has room, lists them.
   */
  only?: "phone" | "rail";
}

function isCurrent(item: NavigationItem, pathname: string): boolean {
  if (matchPath({ path: item.to, end: item.end ?? false }, pathname)) return true;
  return (item.alsoActiveOn ?? []).some((path) => matchPath({ path, end: false }, pathname));
}

export interface NavigationProps {
  items: readonly NavigationItem[];
  className?: string;
}

/**
 * The app's main navigation, with the entries this person's roles cannot use left out. One list
 * serves both layouts: a bottom bar of large targets on phones, a side rail from tablet width up.
 */
export function Navigation({ items, className }: NavigationProps) {
  const { canAnywhere } = useAuthorization();
  const { pathname } = useLocation();
  const visible = items.filter((item) => !item.permission || canAnywhere(item.permission));

  return (
    <nav
      aria-label="Main"
      className={cn(
        "fixed inset-x-0 bottom-0 z-20 border-t border-surface-line bg-surface pb-[env(safe-area-inset-bottom)]",
        "md:static md:border-t-0 md:bg-transparent md:pb-0",
        className,
      )}
    >
      <ul className="flex md:flex-col md:gap-1">
        {visible.map((item) => {
          const current = isCurrent(item, pathname);
          return (
            <li
              key={item.to}
              className={cn(
                "min-w-0 flex-1 md:flex-none",
                item.only === "phone" && "md:hidden",
                item.only === "rail" && "hidden md:block",
              )}
            >
              <Link
                to={item.to}
                aria-current={current ? "page" : undefined}
                className={cn(
                  "flex min-h-16 flex-col items-center justify-center gap-1 border-t-4 px-0.5 text-center text-[11px] leading-tight font-semibold whitespace-nowrap transition-colors min-[420px]:px-2 min-[420px]:text-sm",
                  "md:min-h-tap md:flex-row md:justify-start md:gap-3 md:rounded-lg md:border-t-0 md:px-3 md:py-2 md:text-base",
                  current
                    ? "border-brand-700 bg-brand-50 text-brand-800"
                    : "border-transparent text-ink-muted hover:bg-surface-sunken hover:text-ink",
                )}
              >
                <span aria-hidden="true" className="size-6">
                  {item.icon}
                </span>
                <span className="max-w-full">{item.label}</span>
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
