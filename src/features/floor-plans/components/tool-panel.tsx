import type { ReactNode } from "react";

import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";

export interface ToolPanelProps {
  title: string;
  /** The next thing to do; announced when it changes. */
  instruction: ReactNode;
  children?: ReactNode;
  /** Adds the point under the cross in the middle of the map: taps without a pointer. */
  onUseCentre?: () => void;
}

export function ToolPanel({ title, instruction, children, onUseCentre }: ToolPanelProps) {
  return (
    <Card className="border-brand-300 bg-brand-50/60">
      <h2 className="text-lg font-semibold">{title}</h2>
      <p role="status" className="mt-1 font-semibold text-brand-800">
        {instruction}
      </p>
      <div className="mt-3 flex flex-col gap-4">{children}</div>
      {onUseCentre ? (
        <div className="mt-4 border-t border-surface-line pt-3">
          <Button variant="quiet" className="-ml-2" onClick={onUseCentre}>
            Use the point at the map centre
          </Button>
          <p className="text-sm text-ink-muted">
            Without a pointer: focus the map, move it with the arrow keys until the cross sits on
            the spot, then use this button.
          </p>
        </div>
      ) : null}
    </Card>
  );
}

export function ToolButtons({ children }: { children: ReactNode }) {
  return <div className="flex flex-wrap gap-2">{children}</div>;
}
