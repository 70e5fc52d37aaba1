import { ParentSize } from "@visx/responsive";
import type { ReactNode } from "react";

/** A chart with its text title and description; the chart takes the figure's width. */
export function ChartFigure({ title, description, height = 280, legend, children }: { title: string; description: string; height?: number; legend: ReactNode; children: (width: number, height: number) => ReactNode }) {
  return (
    <figure className="min-w-0 overflow-hidden rounded-md border border-rule bg-card p-4" aria-label={title}>
      <figcaption>
        <h3 className="font-semibold">{title}</h3>
        <p className="text-sm text-ink-soft">{description}</p>
      </figcaption>
      <div className="relative mt-2 w-full min-w-0" style={{ height }} role="img" aria-label={`${title}. ${description}`}>
        <ParentSize debounceTime={50}>{({ width }) => children(width, height)}</ParentSize>
      </div>
      {legend}
    </figure>
  );
}
