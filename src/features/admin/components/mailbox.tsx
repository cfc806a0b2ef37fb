import type { MailboxMessage } from "@shared/schemas/people";
import { useId, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner, SpinnerGlyph } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";

import { useMailbox } from "../api/get-mailbox";
import { LinkedText } from "./linked-text";

function MessageItem({ message }: { message: MailboxMessage }) {
  const [open, setOpen] = useState(false);
  const bodyId = useId();
  const to = message.to.join(", ");

  return (
    <li className="rounded-card border border-surface-line bg-surface shadow-sm">
      <h2 className="text-base">
        <button
          type="button"
          aria-expanded={open}
          aria-controls={bodyId}
          onClick={() => setOpen((value) => !value)}
          className="flex w-full min-h-tap items-start gap-3 rounded-card p-4 text-left hover:bg-brand-50"
        >
          <span
            aria-hidden="true"
            className={cn("mt-0.5 text-brand-700 transition-transform", open && "rotate-90")}
          >
            ▶
          </span>
          <span className="flex min-w-0 flex-1 flex-col gap-0.5">
            <span className="font-semibold text-ink">{message.subject || "(no subject)"}</span>
            <span className="text-sm wrap-anywhere text-ink-muted">To: {to}</span>
            <time dateTime={message.receivedAt} className="text-sm text-ink-muted">
              {formatDateTime(message.receivedAt)}
            </time>
          </span>
        </button>
      </h2>
      <div id={bodyId} hidden={!open} className="border-t border-surface-line px-4 pt-3 pb-4">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1 text-sm">
          <dt className="font-semibold text-ink-muted">From</dt>
          <dd className="wrap-anywhere">{message.from}</dd>
          <dt className="font-semibold text-ink-muted">To</dt>
          <dd className="wrap-anywhere">{to}</dd>
        </dl>
        <div className="mt-3 font-sans text-base leading-relaxed break-words whitespace-pre-wrap">
          <LinkedText text={message.text} />
        </div>
      </div>
    </li>
  );
}

/** What Lintel has "sent" to the network's people, caught by the local mail catcher before it could leave the machine. */
export function Mailbox() {
  const mailbox = useMailbox();

  if (mailbox.isPending) return <Spinner label="Loading messages…" className="py-8" />;
  if (mailbox.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the demo e-mails">
        <p>{mailbox.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void mailbox.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p aria-live="polite" className="text-sm text-ink-muted">
          {mailbox.data.length === 1 ? "1 message" : `${mailbox.data.length} messages`}
        </p>
        <Button
          variant="secondary"
          disabled={mailbox.isFetching}
          aria-busy={mailbox.isFetching || undefined}
          onClick={() => void mailbox.refetch()}
        >
          {mailbox.isFetching ? <SpinnerGlyph className="size-5" /> : null}
          Refresh
        </Button>
      </div>
      {mailbox.data.length === 0 ? (
        <EmptyState
          title="No messages yet"
          description="Invitations and password reset e-mails appear here as soon as Lintel sends them."
        />
      ) : (
        <ul aria-label="Messages" className="flex flex-col gap-3">
          {mailbox.data.map((message) => (
            <MessageItem key={message.id} message={message} />
          ))}
        </ul>
      )}
    </div>
  );
}
