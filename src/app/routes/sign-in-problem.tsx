import { Link, useSearchParams } from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { readProviderProblem } from "@/features/auth/lib/provider-problems";

/**
 * Where a sign-in through the network's provider ends when it gives no session. Only a known reason
 * and a request id shaped like one are read from the address; nothing else of it is shown.
 */
export function SignInProblemRoute() {
  const [searchParams] = useSearchParams();
  const { text, requestId } = readProviderProblem(searchParams);

  return (
    <StandaloneLayout>
      <title>{`${text.title} · Lintel`}</title>
      <Card className="p-6 md:p-8">
        <h1 className="text-2xl font-bold tracking-tight">{text.title}</h1>
        <p className="mt-3">{text.explanation}</p>
        <p className="mt-3">{text.nextStep}</p>
        {requestId ? (
          <div className="mt-5 rounded-lg bg-surface-sunken p-3 text-sm">
            <p className="font-semibold">Reference for your help desk</p>
            <p className="mt-1 font-mono break-all select-all" data-testid="request-id">
              {requestId}
            </p>
          </div>
        ) : null}
        <Link
          to={paths.signIn.getHref()}
          className={buttonStyles({ size: "lg", className: "mt-6 w-full" })}
        >
          Back to sign in
        </Link>
      </Card>
    </StandaloneLayout>
  );
}
