import type { UndeliveredMail } from "@shared/schemas/mail";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { formatDateTime } from "@/lib/format";

import { useUndeliveredMail } from "../api/get-undelivered-mail";
import { useResendMail } from "../api/resend-mail";
import { carriesOneTimeLink, mailTopicLabel } from "../lib/mail-topics";

const statusWords: Record<UndeliveredMail["status"], { label: string; explain: string }> = {
  uncertain: {
    label: "May not have arrived",
    explain: "Lintel stopped while sending it, so it cannot tell whether it left.",
  },
  failed: {
    label: "Not sent",
    explain: "The mail server refused it at every attempt.",
  },
};

function MailItem({
  mail,
  resend,
}: {
  mail: UndeliveredMail;
  resend: { sending: boolean; sent: boolean; error: string | null; onResend: () => void };
}) {
  const status = statusWords[mail.status];
  const headingId = `mail-${mail.id}`;
  return (
    <li
      aria-labelledby={headingId}
      className="rounded-card border border-surface-line bg-surface p-4 shadow-sm"
    >
      <p className="text-sm font-semibold text-ink-muted">{mailTopicLabel(mail.topic)}</p>
      <h2 id={headingId} className="mt-1 text-base font-semibold wrap-anywhere text-ink">
        {mail.subject}
      </h2>
      <dl className="mt-2 grid grid-cols-[max-content_minmax(0,1fr)] gap-x-3 gap-y-1 text-sm">
        <dt className="font-semibold text-ink-muted">To</dt>
        <dd className="wrap-anywhere">
          {mail.recipientName} ({mail.recipient})
        </dd>
        <dt className="font-semibold text-ink-muted">Queued</dt>
        <dd>
          <time dateTime={mail.queuedAt}>{formatDateTime(mail.queuedAt)}</time>
        </dd>
        {mail.lastTriedAt ? (
          <>
            <dt className="font-semibold text-ink-muted">Last try</dt>
            <dd>
              <time dateTime={mail.lastTriedAt}>{formatDateTime(mail.lastTriedAt)}</time>
            </dd>
          </>
        ) : null}
      </dl>
      <p className="mt-3 flex flex-wrap items-center gap-2 text-sm">
        <Badge tone={mail.status === "failed" ? "pending" : "muted"}>
          <span aria-hidden="true" className="mr-1.5">
            {mail.status === "failed" ? "✕" : "?"}
          </span>
          {status.label}
        </Badge>
        <span className="text-ink-muted">{status.explain}</span>
      </p>
      {carriesOneTimeLink(mail.topic) ? (
        <p className="mt-2 text-sm text-ink-muted">
          Its link works once and for a limited time; if it has expired, send a new one from the
          person’s page instead.
        </p>
      ) : null}
      {resend.error ? (
        <Alert role="alert" tone="error" className="mt-3">
          {resend.error}
        </Alert>
      ) : null}
      <div className="mt-3">
        {resend.sent ? (
          <p role="status" className="text-sm font-semibold text-verdict-ready">
            <span aria-hidden="true">✓ </span>Queued to send again.
          </p>
        ) : (
          <Button
            variant="secondary"
            disabled={resend.sending}
            aria-describedby={headingId}
            onClick={resend.onResend}
          >
            {resend.sending ? "Sending again…" : "Resend"}
          </Button>
        )}
      </div>
    </li>
  );
}

/**
 * E-mail to the network's people that may not have arrived, each with one-click Resend. The server
 * sends a mail again at most once however often Resend is pressed.
 */
export function UndeliveredMailList() {
  const list = useUndeliveredMail();
  const resend = useResendMail();

  if (list.isPending) return <Spinner label="Loading e-mail…" className="py-8" />;
  if (list.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the e-mail list">
        <p>{list.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void list.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  if (list.data.length === 0) {
    return (
      <EmptyState
        title="No e-mail in doubt"
        description="No e-mail to your network's people was interrupted or refused by the mail server."
      />
    );
  }
  return (
    <ul aria-label="E-mail that may not have arrived" className="grid gap-3">
      {list.data.map((mail) => {
        const mine = resend.variables === mail.id;
        return (
          <MailItem
            key={mail.id}
            mail={mail}
            resend={{
              sending: mine && resend.isPending,
              sent: mine && resend.isSuccess,
              error: mine && resend.isError ? resend.error.message : null,
              onResend: () => resend.mutate(mail.id),
            }}
          />
        );
      })}
    </ul>
  );
}
