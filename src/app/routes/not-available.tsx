import { EmptyState } from "@/components/ui/empty-state";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";

export interface NotAvailableProps {
  description?: string;
}

/** In place of a page the person's roles do not reach; the server refuses it too. */
export function NotAvailable({
  description = "Your roles do not include this page. If you need it, ask an administrator of your site.",
}: NotAvailableProps) {
  return (
    <>
      <title>Not available · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This page is not available"
        description={description}
        action={<TextLink to={paths.home.getHref()}>Back to my sites</TextLink>}
      />
    </>
  );
}
