import { roleLabels } from "@shared/roles";
import type { Person } from "@shared/schemas/people";
import { useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { useAuthorization } from "@/lib/authorization";

import { useRemoveRole } from "../api/remove-role";
import { grantSiteLabel } from "./grant-options";

type Grant = Person["grants"][number];

function GrantRow({ person, grant }: { person: Person; grant: Grant }) {
  const { canGrant } = useAuthorization();
  const removeRole = useRemoveRole(person.id);
  const [confirming, setConfirming] = useState(false);
  const trigger = useRef<HTMLButtonElement>(null);
  const site = grantSiteLabel(grant);
  const label = `${roleLabels[grant.role]} · ${site}`;

  return (
    <li className="flex flex-col gap-3 py-3 first:pt-0 last:pb-0">
      <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
        <p>
          <span className="font-semibold">{roleLabels[grant.role]}</span>
          <span className="text-ink-muted"> · {site}</span>
        </p>
        {canGrant({ role: grant.role, siteId: grant.siteId }) ? (
          <Button
            ref={trigger}
            variant="secondary"
            aria-expanded={confirming}
            onClick={() => setConfirming(true)}
            disabled={confirming}
          >
            Remove <span className="sr-only">{label}</span>
          </Button>
        ) : null}
      </div>
      {confirming ? (
        <ConfirmStep
          title={`Remove ${label} from ${person.name}?`}
          confirmLabel="Yes, remove"
          cancelLabel="Keep role"
          pending={removeRole.isPending}
          returnFocusRef={trigger}
          onCancel={() => {
            removeRole.reset();
            setConfirming(false);
          }}
          onConfirm={() => removeRole.mutate(grant.id, { onSuccess: () => setConfirming(false) })}
        >
          <p>They lose what this role allows there straight away. You can give it back later.</p>
          {removeRole.isError ? (
            <Alert role="alert" tone="error" title="Could not remove the role">
              {removeRole.error.message}
            </Alert>
          ) : null}
        </ConfirmStep>
      ) : null}
    </li>
  );
}

export function PersonRoles({ person }: { person: Person }) {
  if (person.grants.length === 0) {
    return <p className="text-ink-muted">{person.name} holds no roles at the moment.</p>;
  }
  const grants = [...person.grants].sort(
    (a, b) =>
      Number(a.siteId !== null) - Number(b.siteId !== null) ||
      (a.siteName ?? "").localeCompare(b.siteName ?? "") ||
      roleLabels[a.role].localeCompare(roleLabels[b.role]),
  );
  return (
    <ul aria-label={`Roles of ${person.name}`} className="divide-y divide-surface-line">
      {grants.map((grant) => (
        <GrantRow key={grant.id} person={person} grant={grant} />
      ))}
    </ul>
  );
}
