import { Link } from "react-router-dom";

import { StandaloneLayout } from "@/components/layouts/standalone-layout";
import { buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { paths } from "@/config/paths";

export function NotFoundRoute() {
  return (
    <StandaloneLayout>
      <title>Page not found · Lintel</title>
      <Card className="p-6 text-center md:p-8">
        <h1 className="text-2xl font-bold tracking-tight">Page not found</h1>
        <p className="mt-2 text-ink-muted">
          There is nothing at this address. It may have been mistyped, or the page has moved.
        </p>
        <Link to={paths.home.getHref()} className={buttonStyles({ className: "mt-6" })}>
          Go to my sites
        </Link>
      </Card>
    </StandaloneLayout>
  );
}
