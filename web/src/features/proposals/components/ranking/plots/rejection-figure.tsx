import { useMemo } from "react";
import type { RecommendResult } from "#shared/engine/recommend";
import type { TopologyId } from "#shared/engine/types";
import { rejectionPlot } from "../../../lib/plot-data";
import { rejectionSummary } from "../../../lib/plot-summaries";
import { RejectionChart } from "./lazy-charts";
import { PlotFigure } from "../../../../../components/charts/plot-figure";
import { CommentMark } from "../../comments/comments-context";

/** Every option's tail-limited rejection against frequency, the selected one drawn heavier. */
export function RejectionFigure({
  result,
  selected,
}: {
  result: RecommendResult;
  selected: TopologyId | null;
}) {
  const plot = useMemo(
    () => rejectionPlot(result, selected ?? undefined),
    [result, selected],
  );
  if (!plot) return null;
  const mismatchNote = plot.mismatch
    ? ` The dotted line is the selected option's mismatch-limited worst case (differential output).`
    : "";
  return (
    <>
      <PlotFigure
        title="Rejection against frequency, every option"
        summary={`${rejectionSummary(plot)} Curves at nominal conditions, each up to where its differential gain has fallen 20 dB (at most 1 GHz; 10 MHz for a device card without capacitances); diamonds mark each option's worst corner at the spec frequency.${mismatchNote}`}
      >
        <RejectionChart plot={plot} selected={selected} />
      </PlotFigure>
      {selected && (
        <CommentMark
          anchor={{
            kind: "figure",
            topology: selected,
            figureKey: "rejection",
          }}
          className="mt-1"
        />
      )}
    </>
  );
}
