import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { isApiError } from "@/lib/api-client";
import { errorMessage } from "@/lib/error-message";

export interface DeleteRefusalProps {
  error: unknown;
  /** Offered when the refusal is because the place has history (409). */
  onRetireInstead: () => void;
}

/** Why a delete was refused, and — when the place has history — the way to retire it instead. */
export function DeleteRefusal({ error, onRetireInstead }: DeleteRefusalProps) {
  return (
    <Alert role="alert" tone="error">
      <p>{errorMessage(error)}</p>
      {isApiError(error) && error.status === 409 ? (
        <Button variant="secondary" className="mt-3" onClick={onRetireInstead}>
          Retire instead
        </Button>
      ) : null}
    </Alert>
  );
}
