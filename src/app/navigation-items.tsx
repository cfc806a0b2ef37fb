import { can } from "@shared/permissions";
import type { RoleGrant } from "@shared/roles";
import { useMemo } from "react";

import type { NavigationItem } from "@/components/layouts/navigation";
import {
  AccountIcon,
  ActionsIcon,
  ChecklistIcon,
  CommitteeIcon,
  MailIcon,
  PeopleIcon,
  SitesIcon,
} from "@/components/ui/icons";
import { paths } from "@/config/paths";
import { useAppConfig } from "@/features/admin/api/get-app-config";
import { canAnywhere } from "@/lib/authorization";

/** The main entries; give one a `permission` to hide it from roles that cannot use it. */
export const navigationItems: readonly NavigationItem[] = [
  {
    label: "Sites",
    to: paths.home.getHref(),
    icon: <SitesIcon />,
    end: true,
    alsoActiveOn: [paths.site.path, paths.spaceAudits.path],
  },
  {
    label: "Committee",
    to: paths.committee.getHref(),
    icon: <CommitteeIcon />,
    permission: "read:site:site",
    alsoActiveOn: [paths.committeeSite.path],
  },
  {
    label: "Fixes",
    to: paths.myActions.getHref(),
    icon: <ActionsIcon />,
    permission: "work:action:site",
    alsoActiveOn: [paths.action.path],
  },
  {
    label: "People",
    to: paths.people.getHref(),
    icon: <PeopleIcon />,
    permission: "manage:people:site",
    alsoActiveOn: [paths.undeliveredMail.path],
  },
  {
    label: "Checklists",
    to: paths.checklists.getHref(),
    icon: <ChecklistIcon />,
    permission: "manage:checklists:network",
  },
  {
    label: "Demo e-mails",
    to: paths.mailbox.getHref(),
    icon: <MailIcon />,
    permission: "read:dev-mailbox:network",
  },
  { label: "Account", to: paths.account.getHref(), icon: <AccountIcon /> },
];

/**
 * The entries for this person. The demo e-mails exist only where the local mail catcher runs, so
 * the installation is asked about it, and only when the person could read it at all.
 * The committee view compares sites, so it is offered to those who read the whole network
 * (committee members, administrators); anyone else may still open it for their own sites.
 */
export function useNavigationItems(grants: readonly RoleGrant[]): readonly NavigationItem[] {
  const mayReadMailbox = canAnywhere(grants, "read:dev-mailbox:network");
  const appConfig = useAppConfig({ enabled: mayReadMailbox });
  const demoMailbox = mayReadMailbox && appConfig.data?.demoMailbox === true;
  const readsNetwork = readsEverySite(grants);
  return useMemo(
    () =>
      navigationItems.filter(
        (item) =>
          (demoMailbox || item.to !== paths.mailbox.getHref()) &&
          (readsNetwork || item.to !== paths.committee.getHref()),
      ),
    [demoMailbox, readsNetwork],
  );
}

/** A network-wide grant that reads sites: `can` without a site counts only those. */
function readsEverySite(grants: readonly RoleGrant[]): boolean {
  return canAnywhere(grants, "read:site:site") && can(grants, "read:site:site");
}
