import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { LinkInvalid } from "@/features/auth/components/link-invalid";
import { isApiError } from "@/lib/api-client";

export interface LinkCheckFailedProps {
  error: Error;
  onRetry: () => void;
  offerNewResetLink?: boolean;
}

/**
 * An e-mailed link could not be opened: either the server says it is spent (any 4xx: used,
 * replaced, expired or malformed), or it could not be asked and trying again may help.
 */
export function LinkCheckFailed({ error, onRetry, offerNewResetLink }: LinkCheckFailedProps) {
  if (isApiError(error) && error.status >= 400 && error.status < 500) {
    return <LinkInvalid message={error.message} offerNewResetLink={offerNewResetLink} />;
  }
  return (
    <Card className="p-6 md:p-8">
      <title>Something went wrong · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight">We could not open this link</h1>
      <p className="mt-2 text-ink-muted">{error.message}</p>
      <Button className="mt-6" onClick={onRetry}>
        Try again
      </Button>
    </Card>
  );
}
