import type { QueryClient } from "@tanstack/react-query";
import {
  type LoaderFunctionArgs,
  redirect,
  useLoaderData,
  useLocation,
  useNavigate,
  useSearchParams,
} from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { paths, safeNextPath } from "@/config/paths";
import { SignInForm } from "@/features/auth/components/sign-in-form";

import { isSignedIn } from "../session";
import { type SignedOutNotice, takeHeldSignedOutNotice } from "../signed-out-notice";

function SignedOutAlert({ notice }: { notice: SignedOutNotice["signedOut"] }) {
  if (!notice.kept && notice.reachedLintel) return null;
  return (
    <Alert role="status" tone="info" title="Signed out on this phone" className="mb-4">
      {notice.kept ? (
        <p>
          Your unsent work stays on this phone and is sent when you sign in here again. Nobody else
          who signs in here can see it or send it.
        </p>
      ) : null}
      {notice.reachedLintel ? null : (
        <p className={notice.kept ? "mt-2" : undefined}>
          Lintel could not be reached, so your session there is ended as soon as this phone has
          signal.
        </p>
      )}
    </Alert>
  );
}

export function signInLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    // Back from the provider's sign-out page: the notice waited in this tab meanwhile.
    const held = takeHeldSignedOutNotice();
    if (await isSignedIn(queryClient)) {
      throw redirect(safeNextPath(new URL(request.url).searchParams.get("next")));
    }
    return { held };
  };
}

export function SignInRoute() {
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const next = safeNextPath(searchParams.get("next"));
  const { held } = useLoaderData<{ held: SignedOutNotice | null }>();
  const notice =
    (useLocation().state as Partial<SignedOutNotice> | null)?.signedOut ?? held?.signedOut;

  return (
    <StandaloneLayout>
      <title>Sign in · Lintel</title>
      {notice ? <SignedOutAlert notice={notice} /> : null}
      <Card className="p-6 md:p-8">
        <h1 className="text-2xl font-bold tracking-tight">Sign in to Lintel</h1>
        <p className="mt-2 mb-6 text-ink-muted">
          Readiness checks for isolation rooms, anterooms, donning zones and doffing areas.
        </p>
        <SignInForm
          next={next}
          forgotPasswordHref={paths.forgotPassword.getHref()}
          onSuccess={() => void navigate(next, { replace: true })}
        />
      </Card>
      <p className="mt-6 text-center text-sm text-ink-muted">
        No account yet? Your infection prevention programme lead can add you.
      </p>
    </StandaloneLayout>
  );
}
