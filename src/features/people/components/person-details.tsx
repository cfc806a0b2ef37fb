import type { Person } from "@shared/schemas/people";

import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";

import { GiveRoleForm } from "./give-role-form";
import type { ManageableSite } from "./grant-options";
import { PersonAccess } from "./person-access";
import { PersonInvitation } from "./person-invitation";
import { PersonRoles } from "./person-roles";
import { PersonStatusBadge } from "./person-status-badge";

export interface PersonDetailsProps {
  person: Person;
  manageableSites: readonly ManageableSite[];
  canGrantNetworkWide: boolean;
  currentUserId: string;
  /** A message carried over from the page before, e.g. "Invitation sent to …". */
  notice?: string | null;
}

export function PersonDetails({
  person,
  manageableSites,
  canGrantNetworkWide,
  currentUserId,
  notice,
}: PersonDetailsProps) {
  const mayGive = manageableSites.length > 0 || canGrantNetworkWide;

  return (
    <>
      <div className="mt-2 flex flex-wrap items-center gap-x-3 gap-y-2">
        <h1 className="text-2xl font-bold tracking-tight break-words md:text-3xl">{person.name}</h1>
        <PersonStatusBadge status={person.status} />
      </div>
      <p className="mt-1 wrap-anywhere text-ink-muted">{person.email}</p>

      <div className="mt-6 flex flex-col gap-6">
        {notice ? (
          <Alert role="status" tone="success">
            {notice}
          </Alert>
        ) : null}

        {person.status === "invited" ? (
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Invitation</h2>
            <PersonInvitation person={person} />
          </Card>
        ) : null}

        <Card>
          <h2 className="mb-3 text-lg font-semibold">Roles</h2>
          <PersonRoles person={person} />
          {mayGive ? (
            <div className="mt-5 border-t border-surface-line pt-5">
              <GiveRoleForm
                userId={person.id}
                manageableSites={manageableSites}
                canGrantNetworkWide={canGrantNetworkWide}
              />
            </div>
          ) : null}
        </Card>

        <Card>
          <h2 className="mb-3 text-lg font-semibold">Access</h2>
          <PersonAccess person={person} isSelf={person.id === currentUserId} />
        </Card>
      </div>
    </>
  );
}
