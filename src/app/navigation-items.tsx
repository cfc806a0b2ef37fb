import type { NavigationItem } from "@/components/layouts/navigation";
import { AccountIcon, SitesIcon } from "@/components/ui/icons";
import { paths } from "@/config/paths";

/** The main entries; give one a `permission` to hide it from roles that cannot use it. */
export const navigationItems: readonly NavigationItem[] = [
  {
    label: "Sites",
    to: paths.home.getHref(),
    icon: <SitesIcon />,
    end: true,
    alsoActiveOn: [paths.site.path],
  },
  { label: "Account", to: paths.account.getHref(), icon: <AccountIcon /> },
];
