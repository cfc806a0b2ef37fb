import { fixtureKindLabels, fixtureKinds } from "@shared/zones";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { Spinner } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";

import { ToolButtons, ToolPanel } from "./tool-panel";

const kindOptions = fixtureKinds.map((kind) => ({ value: kind, label: fixtureKindLabels[kind] }));

export interface PlacementDraft {
  kind: string;
  label: string;
}

export interface PlaceFixturePanelProps {
  /** The space the fixture goes in, or null when none is selected. */
  spaceTitle: string | null;
  draft: PlacementDraft;
  onDraftChange: (draft: PlacementDraft) => void;
  pending: boolean;
  error: string | null;
  notice: string | null;
  onDone: () => void;
  onUseCentre?: () => void;
}

export function PlaceFixturePanel({
  spaceTitle,
  draft,
  onDraftChange,
  pending,
  error,
  notice,
  onDone,
  onUseCentre,
}: PlaceFixturePanelProps) {
  const kindLabel = kindOptions.find((option) => option.value === draft.kind)?.label;
  const instruction = !spaceTitle
    ? "Select a space first: choose it in the list of spaces."
    : kindLabel
      ? `Tap the spot inside ${spaceTitle} where the ${kindLabel.toLowerCase()} stands.`
      : "Choose a fixture type, then tap its spot on the plan.";

  return (
    <ToolPanel
      title="Place a fixture"
      instruction={instruction}
      onUseCentre={spaceTitle && kindLabel ? onUseCentre : undefined}
    >
      {spaceTitle ? (
        <p className="text-sm">
          Placing in <span className="font-semibold">{spaceTitle}</span>. To place in another space,
          choose it in the list of spaces.
        </p>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Fixture type"
          placeholder="Choose a fixture type"
          options={kindOptions}
          value={draft.kind}
          onChange={(event) => onDraftChange({ ...draft, kind: event.target.value })}
        />
        <TextField
          label="Label"
          hint="Optional, such as By the door."
          autoComplete="off"
          maxLength={80}
          value={draft.label}
          onChange={(event) => onDraftChange({ ...draft, label: event.target.value })}
        />
      </div>
      {pending ? <Spinner label="Placing the fixture…" /> : null}
      {error ? (
        <Alert role="alert" tone="error" title="Not placed">
          {error}
        </Alert>
      ) : null}
      {notice && !error && !pending ? (
        <Alert role="status" tone="success">
          {notice}
        </Alert>
      ) : null}
      <ToolButtons>
        <Button variant="secondary" onClick={onDone}>
          Done
        </Button>
      </ToolButtons>
    </ToolPanel>
  );
}
