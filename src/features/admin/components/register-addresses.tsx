import { useState } from "react";

import { Button } from "@/components/ui/button";

function CopyableAddress({ label, hint, value }: { label: string; hint: string; value: string }) {
  const [copied, setCopied] = useState<"yes" | "no" | null>(null);
  return (
    <div className="flex flex-col gap-1.5">
      <p className="font-semibold">{label}</p>
      <p className="text-sm text-ink-muted">{hint}</p>
      <p className="rounded-lg border border-surface-line bg-surface-sunken px-3 py-2 font-mono text-sm break-all select-all">
        {value}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <Button
          variant="secondary"
          onClick={() => {
            const clipboard = typeof navigator === "undefined" ? undefined : navigator.clipboard;
            if (!clipboard) {
              setCopied("no");
              return;
            }
            clipboard.writeText(value).then(
              () => setCopied("yes"),
              () => setCopied("no"),
            );
          }}
        >
          Copy <span className="sr-only">{label.toLowerCase()}</span>
        </Button>
        <span role="status" className="text-sm text-ink-muted">
          {copied === "yes"
            ? "Copied."
            : copied === "no"
              ? "This browser did not allow copying: select the address and copy it."
              : null}
        </span>
      </div>
    </div>
  );
}

export interface RegisterAddressesProps {
  redirectUri: string;
  postLogoutRedirectUri: string;
}

/** The two addresses the provider's administrator registers for Lintel, ready to copy. */
export function RegisterAddresses({ redirectUri, postLogoutRedirectUri }: RegisterAddressesProps) {
  return (
    <div className="flex flex-col gap-5">
      <CopyableAddress
        label="Redirect URI"
        hint="Where the provider sends people back to Lintel after they sign in."
        value={redirectUri}
      />
      <CopyableAddress
        label="Post-logout redirect URI"
        hint="Where the provider sends people after signing them out."
        value={postLogoutRedirectUri}
      />
    </div>
  );
}
