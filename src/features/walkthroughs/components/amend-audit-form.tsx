import type { AuditDetail } from "@shared/schemas/audits";
import { lazy, Suspense, useState } from "react";

/**
 * The form's code, with the form library it alone uses on the audit screen, loads only when
 * someone opens the panel: an auditor answering on a phone never needs it. The service worker
 * keeps it with the rest of the app, so it opens offline too; a failed load says so instead of
 * breaking the audit screen.
 */
const AmendAuditFormBody = lazy(() =>
  import("./amend-audit-form-body").then(
    (module) => ({ default: module.AmendAuditFormBody }),
    () => ({ default: AmendFormUnavailable }),
  ),
);

function AmendFormUnavailable() {
  return (
    <p role="alert" className="mt-3 text-sm text-ink-muted">
      The amendment form could not be loaded. Amending needs a connection: open this audit again
      when you have signal.
    </p>
  );
}

/**
 * For administrators: correct one answer of a submitted audit. The reason is kept in the change
 * log with the answer before and after, and the verdict is decided again.
 */
export function AmendAuditForm({ detail }: { detail: AuditDetail }) {
  const [opened, setOpened] = useState(false);
  return (
    <details
      className="w-full rounded-card border border-surface-line bg-surface p-4"
      onToggle={(event) => {
        if (event.currentTarget.open) setOpened(true);
      }}
    >
      <summary className="min-h-tap cursor-pointer py-2 font-semibold text-brand-800">
        Amend an answer
      </summary>
      {opened ? (
        <Suspense
          fallback={
            <p role="status" className="mt-3 text-sm text-ink-muted">
              Opening the form…
            </p>
          }
        >
          <AmendAuditFormBody detail={detail} />
        </Suspense>
      ) : null}
    </details>
  );
}
