import { type FormEvent, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { isApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";

import { useUploadFloorPlan } from "../api/upload-floor-plan";
import { acceptedPlanTypes, planFileProblem } from "../lib/plan-upload";

function uploadErrorMessage(error: unknown): string {
  if (!isApiError(error)) return "The plan could not be uploaded. Please try again.";
  return error.fieldError("plan") ?? error.message;
}

export interface PlanUploadFormProps {
  floorId: string;
  /** A plan is already there: the form replaces it. */
  hasPlan: boolean;
}

/** Sends a plan image for the floor; the first one fixes the floor's coordinate space. */
export function PlanUploadForm({ floorId, hasPlan }: PlanUploadFormProps) {
  const upload = useUploadFloorPlan(floorId);
  const input = useRef<HTMLInputElement>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [uploaded, setUploaded] = useState(false);

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = event.currentTarget;
    const file = input.current?.files?.[0];
    const found = planFileProblem(file);
    if (found || !file) {
      setProblem(found);
      input.current?.focus();
      return;
    }
    setProblem(null);
    upload.mutate(file, {
      onSuccess: () => {
        setUploaded(true);
        form.reset();
      },
      onError: (error) => {
        setProblem(uploadErrorMessage(error));
        input.current?.focus();
      },
    });
  };

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {uploaded && !problem ? (
        <Alert role="status" tone="success">
          The new plan is uploaded.
        </Alert>
      ) : null}
      <Field
        label="Floor plan image"
        hint={
          hasPlan
            ? "JPEG, PNG or WebP, up to 15 MB. The new image is stretched over the same area as the first, so spaces and fixtures keep their places: use the same floor, framed the same way."
            : "JPEG, PNG or WebP, up to 15 MB. A clear drawing of the whole floor works best; its size sets the plan's units."
        }
        error={problem ?? undefined}
      >
        {(control) => (
          <input
            {...control}
            ref={input}
            type="file"
            name="plan"
            accept={acceptedPlanTypes}
            onChange={() => {
              setProblem(null);
              setUploaded(false);
            }}
            className={cn(
              "min-h-tap w-full rounded-lg border border-dashed border-ink-subtle bg-surface p-2 text-base text-ink",
              "file:mr-3 file:min-h-10 file:rounded-lg file:border-0 file:bg-brand-50 file:px-4 file:font-semibold file:text-brand-800",
              problem && "border-verdict-not-ready",
            )}
          />
        )}
      </Field>
      <Button
        type="submit"
        variant={hasPlan ? "secondary" : "primary"}
        disabled={upload.isPending}
        aria-busy={upload.isPending || undefined}
        className="self-start"
      >
        {upload.isPending ? <SpinnerGlyph className="size-5" /> : null}
        {hasPlan ? "Replace plan" : "Upload plan"}
      </Button>
    </form>
  );
}
