import { monitorMappingBodySchema, type PressureMonitor } from "@shared/schemas/pressure-space";
import { type FormEvent, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";

import { useMapMonitor } from "../api/map-monitor";
import { useUnmapMonitor } from "../api/unmap-monitor";

export interface MonitorFormProps {
  spaceId: string;
  /** The monitor mapped now, or null to map one. */
  monitor: PressureMonitor | null;
  className?: string;
}

type Fields = Partial<Record<"monitorId" | "thresholdPa", string>>;

/**
 * Maps the building's monitor id to this room, with the room's own threshold in Pa if it has one
 * (empty: Lintel's default, −2.5 Pa). Field errors come from the same schema the server checks,
 * then from the server's answer (an id already mapped elsewhere).
 */
export function MonitorForm({ spaceId, monitor, className }: MonitorFormProps) {
  const [monitorId, setMonitorId] = useState(monitor?.monitorId ?? "");
  const [threshold, setThreshold] = useState(
    monitor && !monitor.thresholdIsDefault ? String(monitor.thresholdPa) : "",
  );
  const [fields, setFields] = useState<Fields>({});
  const [message, setMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const map = useMapMonitor(spaceId);
  const unmap = useUnmapMonitor(spaceId);
  const [confirming, setConfirming] = useState(false);
  const unmapButton = useRef<HTMLButtonElement>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    setSaved(null);
    setMessage(null);
    const trimmed = threshold.trim().replace("−", "-");
    const number = trimmed === "" ? null : Number(trimmed);
    const parsed = monitorMappingBodySchema.safeParse({
      monitorId,
      thresholdPa: number !== null && Number.isNaN(number) ? trimmed : number,
    });
    if (!parsed.success) {
      const next: Fields = {};
      for (const issue of parsed.error.issues) {
        const key = String(issue.path[0]) as keyof Fields;
        next[key] ??= issue.message;
      }
      if (number !== null && Number.isNaN(number))
        next.thresholdPa = "Enter a number of Pa, such as −5.";
      setFields(next);
      return;
    }
    setFields({});
    map.mutate(parsed.data, {
      onSuccess: (mapped) => setSaved(`Monitor ${mapped.monitorId} is mapped to this room.`),
      onError: (error) => {
        if (isApiError(error)) {
          const next: Fields = {
            monitorId: error.fieldError("monitorId"),
            thresholdPa: error.fieldError("thresholdPa"),
          };
          setFields(next);
          if (!next.monitorId && !next.thresholdPa) setMessage(error.message);
        } else setMessage("Lintel could not save the mapping. Try again.");
      },
    });
  }

  return (
    <form onSubmit={submit} noValidate className={cn("flex flex-col gap-4", className)}>
      <TextField
        label="Monitor id"
        hint="The id the building gives the monitor: the last level of its topic, such as wexley-4-iso-1."
        value={monitorId}
        onChange={(event) => setMonitorId(event.target.value)}
        error={fields.monitorId}
        autoComplete="off"
        spellCheck={false}
      />
      <TextField
        label="Threshold in Pa (optional)"
        hint="Empty: −2.5 Pa, the CDC's figure for isolation rooms. A room may be held to a stricter figure, such as −5."
        value={threshold}
        onChange={(event) => setThreshold(event.target.value)}
        error={fields.thresholdPa}
        inputMode="decimal"
        autoComplete="off"
      />
      {message ? (
        <Alert tone="error" role="alert">
          {message}
        </Alert>
      ) : null}
      {saved ? (
        <Alert tone="success" role="status">
          {saved}
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={map.isPending}>
          {monitor ? "Save the monitor" : "Map the monitor"}
        </Button>
        {monitor ? (
          <Button
            ref={unmapButton}
            variant="secondary"
            disabled={unmap.isPending || confirming}
            onClick={() => {
              setSaved(null);
              setMessage(null);
              setConfirming(true);
            }}
          >
            Unmap the monitor
          </Button>
        ) : null}
      </div>
      {monitor && confirming ? (
        <ConfirmStep
          title={`Unmap ${monitor.monitorId}?`}
          confirmLabel="Unmap"
          pending={unmap.isPending}
          returnFocusRef={unmapButton}
          onCancel={() => setConfirming(false)}
          onConfirm={() =>
            unmap.mutate(undefined, {
              onSettled: () => setConfirming(false),
              onError: (error) =>
                setMessage(
                  isApiError(error)
                    ? (error.fieldError("monitorId") ?? error.message)
                    : "Lintel could not unmap the monitor. Try again.",
                ),
            })
          }
        >
          <p>
            The room stops alarming now, and an alarm still open ends. Its alarm log and the hours
            the monitor watched it stay with the room; the id can then be mapped to another room.
          </p>
        </ConfirmStep>
      ) : null}
    </form>
  );
}
