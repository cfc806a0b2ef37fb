import { can, type Permission } from "@shared/permissions";
import type { RoleGrant } from "@shared/roles";
import { type ReactNode, useMemo } from "react";

import type { NavigationItem } from "@/components/layouts/navigation";
import {
  AccountIcon,
  ActionsIcon,
  AdminIcon,
  ChecklistIcon,
  CommitteeIcon,
  KeyIcon,
  MailIcon,
  ObservationIcon,
  PeopleIcon,
  SitesIcon,
} from "@/components/ui/icons";
import { paths } from "@/config/paths";
import { useAppConfig } from "@/features/admin/api/get-app-config";
import { canAnywhere } from "@/lib/authorization";

/** A page of the administrator's, listed on the Admin page and (some) in the side rail. */
export interface AdminEntry {
  label: string;
  /** One line on the Admin page saying what the page is for. */
  description: string;
  to: string;
  icon: ReactNode;
  permission: Permission;
  /** Also listed in the side rail on wide screens. */
  onRail: boolean;
  alsoActiveOn?: readonly string[];
}

/** The network's identity provider is the network-wide administrator's to set. */
export const signInSettingsPermission: Permission = "manage:identity-provider:network";

/** The administrator's rarer pages: one "Admin" entry in the phone's bar, listed in the rail. */
export const adminEntries: readonly AdminEntry[] = [
  {
    label: "People",
    description: "Invite colleagues, give and take away roles, deactivate accounts.",
    to: paths.people.getHref(),
    icon: <PeopleIcon />,
    permission: "manage:people:site",
    onRail: true,
    alsoActiveOn: [paths.undeliveredMail.path],
  },
  {
    label: "Checklists",
    description: "The questions each kind of space is audited against, and their revisions.",
    to: paths.checklists.getHref(),
    icon: <ChecklistIcon />,
    permission: "manage:checklists:network",
    onRail: true,
  },
  {
    label: "Observation steps",
    description:
      "The putting-on and removal steps observers read aloud, and how long observation detail is kept.",
    to: paths.sequences.getHref(),
    icon: <ObservationIcon />,
    permission: "manage:checklists:network",
    onRail: true,
  },
  {
    label: "Sign-in",
    description:
      "Let people sign in with your organisation's own account (identity provider), and whether passwords stay allowed.",
    to: paths.signInSettings.getHref(),
    icon: <KeyIcon />,
    permission: signInSettingsPermission,
    onRail: false,
  },
  {
    label: "Undelivered mail",
    description: "E-mail that may not have arrived, to send again.",
    to: paths.undeliveredMail.getHref(),
    icon: <MailIcon />,
    permission: "resend:mail:network",
    onRail: false,
  },
  // Last: it shows once the installation has said whether it keeps demo mail.
  {
    label: "Demo e-mails",
    description: "The e-mails this demo installation has sent, as people receive them.",
    to: paths.mailbox.getHref(),
    icon: <MailIcon />,
    permission: "read:dev-mailbox:network",
    onRail: true,
  },
];

const adminPaths = [paths.admin.path, ...adminEntries.map((entry) => entry.to)];

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
    label: "Admin",
    to: paths.admin.getHref(),
    icon: <AdminIcon />,
    // Every administrator may manage people; the other admin pages need more of the same role.
    permission: "manage:people:site",
    only: "phone",
    end: true,
    alsoActiveOn: adminPaths,
  },
  ...adminEntries
    .filter((entry) => entry.onRail)
    .map((entry): NavigationItem => ({
      label: entry.label,
      to: entry.to,
      icon: entry.icon,
      permission: entry.permission,
      only: "rail",
      alsoActiveOn: entry.alsoActiveOn,
    })),
  { label: "Account", to: paths.account.getHref(), icon: <AccountIcon /> },
];

/** Whether the local mail catcher runs here, asked only when the person could read it at all. */
function useDemoMailbox(grants: readonly RoleGrant[]): boolean {
  const mayReadMailbox = canAnywhere(grants, "read:dev-mailbox:network");
  const appConfig = useAppConfig({ enabled: mayReadMailbox });
  return mayReadMailbox && appConfig.data?.demoMailbox === true;
}

/**
 * The entries for this person. The demo e-mails exist only where the local mail catcher runs, so
 * the installation is asked about it, and only when the person could read it at all.
 * The committee view compares sites, so it is offered to those who read the whole network
 * (committee members, administrators); anyone else may still open it for their own sites.
 */
export function useNavigationItems(grants: readonly RoleGrant[]): readonly NavigationItem[] {
  const demoMailbox = useDemoMailbox(grants);
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

/** The admin pages this person's roles reach, for the Admin page. */
export function useAdminEntries(grants: readonly RoleGrant[]): readonly AdminEntry[] {
  const demoMailbox = useDemoMailbox(grants);
  return useMemo(
    () =>
      adminEntries.filter(
        (entry) =>
          canAnywhere(grants, entry.permission) &&
          (demoMailbox || entry.to !== paths.mailbox.getHref()),
      ),
    [grants, demoMailbox],
  );
}

/** A network-wide grant that reads sites: `can` without a site counts only those. */
function readsEverySite(grants: readonly RoleGrant[]): boolean {
  return canAnywhere(grants, "read:site:site") && can(grants, "read:site:site");
}
