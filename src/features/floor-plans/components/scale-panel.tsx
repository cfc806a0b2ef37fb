import { formatLength, planDistance, type PlanPoint } from "@shared/calc/plan-geometry";
import { scaleBodySchema } from "@shared/schemas/floors";
import { type FormEvent, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { parseNumberText } from "@/lib/form-values";

import { useSetFloorScale } from "../api/set-floor-scale";
import { ToolButtons, ToolPanel } from "./tool-panel";

export interface ScalePanelProps {
  floorId: string;
  points: readonly PlanPoint[];
  onPickAgain: () => void;
  onCancel: () => void;
  onSaved: () => void;
  onUseCentre?: () => void;
}

const instructions = ["Tap the first point", "Tap the second point", "Enter the real distance"];

/** Sets metres per plan unit from two tapped points and the real distance between them. */
export function ScalePanel({
  floorId,
  points,
  onPickAgain,
  onCancel,
  onSaved,
  onUseCentre,
}: ScalePanelProps) {
  const setScale = useSetFloorScale(floorId);
  const [distance, setDistance] = useState("");
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [panelError, setPanelError] = useState<string | null>(null);
  const [a, b] = points;
  const typedMetres = parseNumberText(distance);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!a || !b) return;
    const parsed = scaleBodySchema.safeParse({ a, b, distanceMetres: parseNumberText(distance) });
    if (!parsed.success) {
      const distanceIssue = parsed.error.issues.find((issue) => issue.path[0] === "distanceMetres");
      setFieldError(distanceIssue?.message ?? null);
      setPanelError(distanceIssue ? null : (parsed.error.issues[0]?.message ?? null));
      return;
    }
    setFieldError(null);
    setPanelError(null);
    setScale.mutate(parsed.data, {
      onSuccess: onSaved,
      onError: (error) => {
        const forDistance = isApiError(error) ? error.fieldError("distanceMetres") : undefined;
        if (forDistance) setFieldError(forDistance);
        else
          setPanelError(
            isApiError(error) ? error.message : "The scale could not be saved. Please try again.",
          );
      },
    });
  };

  return (
    <ToolPanel
      title="Set scale"
      instruction={instructions[Math.min(points.length, 2)]}
      onUseCentre={points.length < 2 ? onUseCentre : undefined}
    >
      <p className="text-sm text-ink-muted">
        Pick two points whose real distance you know: the ends of a dimension line, a wall of known
        length, or a standard door opening. The further apart, the better the scale.
      </p>
      {a && b ? (
        <form noValidate onSubmit={submit} className="flex flex-col gap-3">
          <p className="text-sm">
            The two points are {Math.round(planDistance(a, b))} plan units apart.
          </p>
          {panelError ? (
            <Alert role="alert" tone="error">
              {panelError}
            </Alert>
          ) : null}
          <TextField
            label="Real distance (metres)"
            inputMode="decimal"
            autoComplete="off"
            value={distance}
            hint={
              typedMetres !== undefined && typedMetres > 0
                ? `That is ${formatLength(typedMetres)}.`
                : "Such as 0.9 for a 90 cm door opening."
            }
            error={fieldError ?? undefined}
            onChange={(event) => setDistance(event.target.value)}
          />
          <ToolButtons>
            <Button
              type="submit"
              disabled={setScale.isPending}
              aria-busy={setScale.isPending || undefined}
            >
              {setScale.isPending ? <SpinnerGlyph className="size-5" /> : null}
              Save scale
            </Button>
            <Button variant="secondary" onClick={onPickAgain}>
              Pick again
            </Button>
            <Button variant="secondary" onClick={onCancel}>
              Cancel
            </Button>
          </ToolButtons>
        </form>
      ) : (
        <ToolButtons>
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        </ToolButtons>
      )}
    </ToolPanel>
  );
}
