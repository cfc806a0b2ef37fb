import { zodResolver } from "@hookform/resolvers/zod";
import { type AmendmentBody, amendmentBodySchema, type AuditDetail } from "@shared/schemas/audits";
import { useState } from "react";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { TextAreaField } from "@/components/ui/text-area-field";
import { formLevelMessage, showServerFieldErrors } from "@/lib/form-errors";

import { useAmendAudit } from "../api/amend-audit";

const fieldNames = ["itemId", "outcome", "note", "reason"] as const;

/**
 * The amendment form itself: one answer of a submitted audit corrected, with its reason. Loaded
 * when its panel is first opened (`AmendAuditForm`).
 */
export function AmendAuditFormBody({ detail }: { detail: AuditDetail }) {
  const amend = useAmendAudit(detail.audit.id);
  const [done, setDone] = useState<string | null>(null);
  const form = useForm<AmendmentBody>({
    resolver: zodResolver(amendmentBodySchema),
    defaultValues: { itemId: detail.items[0]?.id ?? "", outcome: "pass", note: "", reason: "" },
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setDone(null);
    try {
      await amend.mutateAsync({ ...values, note: values.note || null });
      const item = detail.items.find((candidate) => candidate.id === values.itemId);
      setDone(
        `Amended "${item?.text ?? "the item"}". The verdict is now decided from the corrected answer.`,
      );
      form.reset({ ...values, reason: "" });
    } catch (error) {
      showServerFieldErrors(error, form.setError, fieldNames);
    }
  });
  const formError = formLevelMessage(
    amend.error,
    fieldNames,
    "The amendment could not be saved. Try again.",
  );

  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 flex flex-col gap-4">
      <p className="text-sm text-ink-muted">
        A submitted audit is not edited in place. A correction is recorded with its reason and who
        made it; the verdict and score are worked out again.
      </p>
      <SelectField
        label="Item"
        options={detail.items.map((item, index) => ({
          value: item.id,
          label: `${index + 1}. ${item.text}`,
        }))}
        error={errors.itemId?.message}
        {...form.register("itemId")}
      />
      <SelectField
        label="Corrected answer"
        options={[
          { value: "pass", label: "Pass" },
          { value: "fail", label: "Fail" },
          { value: "not_applicable", label: "Not applicable" },
        ]}
        error={errors.outcome?.message}
        {...form.register("outcome")}
      />
      <TextAreaField
        label="Note (optional)"
        rows={2}
        error={errors.note?.message}
        {...form.register("note")}
      />
      <TextAreaField
        label="Reason for the amendment"
        rows={2}
        error={errors.reason?.message}
        {...form.register("reason")}
      />
      {formError ? (
        <Alert tone="error" title="Not amended" role="alert">
          <p>{formError}</p>
        </Alert>
      ) : null}
      {done ? (
        <p role="status" className="text-sm font-semibold text-verdict-ready">
          {done}
        </p>
      ) : null}
      <div>
        <Button type="submit" disabled={amend.isPending}>
          Record amendment
        </Button>
      </div>
    </form>
  );
}
