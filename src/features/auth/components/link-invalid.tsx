import { Card } from "@/components/ui/card";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";

export interface LinkInvalidProps {
  /** The server's explanation (used, replaced or expired), or ours when it could not be asked. */
  message: string;
  /** For reset links: a way to ask for a new one. */
  offerNewResetLink?: boolean;
}

/** Shown instead of a form when an e-mailed link can no longer be used. */
export function LinkInvalid({ message, offerNewResetLink = false }: LinkInvalidProps) {
  return (
    <Card className="p-6 md:p-8">
      <title>Link no longer works · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight">This link no longer works</h1>
      <p className="mt-2 text-ink-muted">{message}</p>
      <ul className="mt-6 flex flex-col gap-3">
        {offerNewResetLink ? (
          <li>
            <TextLink to={paths.forgotPassword.getHref()}>Ask for a new reset link</TextLink>
          </li>
        ) : null}
        <li>
          <TextLink to={paths.signIn.getHref()}>Go to sign in</TextLink>
        </li>
      </ul>
    </Card>
  );
}
