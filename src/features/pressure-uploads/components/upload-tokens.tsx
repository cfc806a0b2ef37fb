import type { UploadToken } from "@shared/schemas/pressure-uploads";
import { type FormEvent, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { CopyValue } from "@/components/ui/copy-value";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";

import { useCreateUploadToken } from "../api/create-upload-token";
import { useUploadTokens } from "../api/get-upload-tokens";
import { useRevokeUploadToken } from "../api/revoke-upload-token";

/** The token just made, shown this once with a way to copy it. */
function NewToken({ name, secret, onDone }: { name: string; secret: string; onDone: () => void }) {
  return (
    <Alert tone="success" title={`Token for ${name} made`}>
      <p className="mb-2">
        Copy it now and keep it with the gateway or script that uploads. Lintel keeps only a
        fingerprint of it: it is not shown again.
      </p>
      <CopyValue value={secret} noun="token" copyLabel="Copy token">
        <Button variant="quiet" onClick={onDone}>
          Done
        </Button>
      </CopyValue>
    </Alert>
  );
}

function CreateToken({ siteId }: { siteId: string }) {
  const create = useCreateUploadToken(siteId);
  const [name, setName] = useState("");
  const [made, setMade] = useState<{ name: string; secret: string } | null>(null);
  const error = create.error;
  const nameError = isApiError(error) ? error.fieldError("name") : undefined;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    create.mutate(name, {
      onSuccess: (reply) => {
        setMade({ name: reply.token.name, secret: reply.secret });
        setName("");
      },
    });
  };

  if (made) return <NewToken {...made} onDone={() => setMade(null)} />;
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <TextField
        label="Name of the new token"
        hint="What uploads with it, e.g. Building 2 gateway, so you know which to revoke."
        value={name}
        maxLength={80}
        onChange={(event) => setName(event.target.value)}
        error={nameError}
      />
      {error && !nameError ? (
        <Alert role="alert" tone="error" title="Not made">
          <p>{error.message}</p>
        </Alert>
      ) : null}
      <Button
        type="submit"
        className="self-start"
        disabled={create.isPending}
        aria-busy={create.isPending || undefined}
      >
        {create.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Create token
      </Button>
    </form>
  );
}

function TokenRow({ siteId, token }: { siteId: string; token: UploadToken }) {
  const revoke = useRevokeUploadToken(siteId);
  const [confirming, setConfirming] = useState(false);
  const trigger = useRef<HTMLButtonElement>(null);
  const revoked = token.revokedAt !== null;
  return (
    <li className="flex flex-col gap-2 border-t border-surface-line py-3 first:border-t-0">
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-semibold break-words">{token.name}</span>
        {revoked ? <Badge tone="muted">Revoked</Badge> : <Badge tone="positive">In use</Badge>}
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm text-ink-muted">
        <dt>Made</dt>
        <dd>
          {formatDateTime(token.createdAt)}
          {token.createdByName ? ` by ${token.createdByName}` : ""}
        </dd>
        <dt>Last upload</dt>
        <dd>{token.lastUsedAt ? formatDateTime(token.lastUsedAt) : "Never used"}</dd>
        {revoked ? (
          <>
            <dt>Revoked</dt>
            <dd>{formatDateTime(token.revokedAt!)}</dd>
          </>
        ) : null}
      </dl>
      {revoked ? null : (
        <Button
          ref={trigger}
          variant="secondary"
          className="self-start"
          disabled={confirming}
          onClick={() => setConfirming(true)}
        >
          Revoke <span className="sr-only">{token.name}</span>
        </Button>
      )}
      {revoke.isError ? (
        <Alert role="alert" tone="error" title="Not revoked">
          <p>{revoke.error.message}</p>
        </Alert>
      ) : null}
      {confirming ? (
        <ConfirmStep
          title={`Revoke ${token.name}?`}
          confirmLabel="Revoke token"
          cancelLabel="Keep it"
          pending={revoke.isPending}
          returnFocusRef={trigger}
          onConfirm={() => revoke.mutate(token.id, { onSuccess: () => setConfirming(false) })}
          onCancel={() => setConfirming(false)}
        >
          <p>
            Uploads with this token are refused from now on. Readings already stored stay. A new
            token is needed to upload again.
          </p>
        </ConfirmStep>
      ) : null}
    </li>
  );
}

/** A site's pressure upload tokens: for buildings that send readings over HTTP, not a broker. */
export function UploadTokens({ siteId }: { siteId: string }) {
  const tokens = useUploadTokens(siteId);
  return (
    <section aria-labelledby="upload-tokens-heading" className="flex flex-col gap-4">
      <div>
        <h2 id="upload-tokens-heading" className="text-lg font-semibold">
          Pressure upload tokens
        </h2>
        <p className="mt-1 text-sm text-ink-muted">
          For buildings without a broker: a script or gateway sends room-pressure readings (JSON or
          CSV) to Lintel with one of these tokens. Each token uploads for this site only.
        </p>
      </div>
      <CreateToken siteId={siteId} />
      {tokens.isPending ? (
        // Plain words, not a live status: the page's own notices are the ones announced here.
        <p className="text-sm text-ink-muted">Loading tokens…</p>
      ) : tokens.isError ? (
        <Alert role="alert" tone="error" title="We could not load the tokens">
          <p>{tokens.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void tokens.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : tokens.data.tokens.length === 0 ? (
        <p className="text-sm text-ink-muted">No tokens yet.</p>
      ) : (
        <ul aria-label="Upload tokens">
          {tokens.data.tokens.map((token) => (
            <TokenRow key={token.id} siteId={siteId} token={token} />
          ))}
        </ul>
      )}
    </section>
  );
}
