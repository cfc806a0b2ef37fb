import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";

import { useUndeliveredMail } from "../api/get-undelivered-mail";

export interface UndeliveredMailNoticeProps {
  href: string;
}

/** On a network administrator's home page while any e-mail may not have arrived. */
export function UndeliveredMailNotice({ href }: UndeliveredMailNoticeProps) {
  const { data } = useUndeliveredMail();
  if (!data || data.length === 0) return null;
  const count = data.length;
  return (
    <Alert
      tone="warning"
      className="mb-6"
      title={
        <>
          <span aria-hidden="true">⚠ </span>
          {count === 1 ? "1 e-mail may not have arrived" : `${count} e-mails may not have arrived`}
        </>
      }
    >
      <p>
        Lintel could not confirm that {count === 1 ? "it was" : "they were"} sent.{" "}
        <Link to={href} className="font-semibold text-brand-700 underline">
          Review and resend
        </Link>
      </p>
    </Alert>
  );
}
