import type { Person } from "@shared/schemas/people";
import { useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { formatDateTime } from "@/lib/format";

import { useResendInvitation } from "../api/resend-invitation";

function linkStillWorks(expiresAt: string | null, now: number): expiresAt is string {
  return expiresAt !== null && new Date(expiresAt).getTime() > now;
}

/** For someone invited who has not set a password yet: when their link stops, and a new one. */
export function PersonInvitation({ person }: { person: Person }) {
  const resend = useResendInvitation(person.id);
  const [sentAgain, setSentAgain] = useState(false);
  const [now] = useState(() => Date.now());

  return (
    <div className="flex flex-col gap-3">
      {linkStillWorks(person.invitationExpiresAt, now) ? (
        <p>
          {person.name} has not set a password yet. The link in their invitation works until{" "}
          <time dateTime={person.invitationExpiresAt} className="font-semibold">
            {formatDateTime(person.invitationExpiresAt)}
          </time>
          .
        </p>
      ) : (
        <p>
          {person.name} has not set a password yet, and the link in their invitation no longer
          works. Send a new one so they can join.
        </p>
      )}
      {sentAgain && !resend.isPending ? (
        <Alert role="status" tone="success">
          A new invitation is on its way to {person.email}. The link sent before no longer works.
        </Alert>
      ) : null}
      {resend.isError ? (
        <Alert role="alert" tone="error" title="Could not send a new invitation">
          {resend.error.message}
        </Alert>
      ) : null}
      <Button
        variant="secondary"
        className="self-start"
        disabled={resend.isPending}
        aria-busy={resend.isPending || undefined}
        onClick={() => {
          setSentAgain(false);
          resend.mutate(undefined, { onSuccess: () => setSentAgain(true) });
        }}
      >
        {resend.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Send a new invitation
      </Button>
    </div>
  );
}
