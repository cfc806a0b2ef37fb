import { CopyValue } from "@/components/ui/copy-value";

function CopyableAddress({ label, hint, value }: { label: string; hint: string; value: string }) {
  return (
    <div className="flex flex-col gap-1.5">
      <p className="font-semibold">{label}</p>
      <p className="text-sm text-ink-muted">{hint}</p>
      <CopyValue
        value={value}
        noun="address"
        copyLabel={
          <>
            Copy <span className="sr-only">{label.toLowerCase()}</span>
          </>
        }
      />
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
