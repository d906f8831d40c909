import type { ScoreParts } from "~/analysis/types";
import { percent } from "~/utils/noteText";
import { scoreBreakdown } from "~/takes/scoreBreakdown";

/** The score with the parts it is built from: each part's value, its weight and the points it brings. */
export function ScoreExplained({ score, parts }: { score: number; parts: ScoreParts }) {
  const rows = scoreBreakdown(parts);
  return (
    <section
      aria-labelledby="score-heading"
      className="rounded-md border border-line bg-white px-4 py-3"
      data-testid="score-explained"
    >
      <div className="flex flex-wrap items-baseline gap-x-3">
        <h3 id="score-heading" className="text-xs font-semibold uppercase tracking-wide text-ink-soft">
          Score
        </h3>
        <p className="text-3xl font-semibold">{score}</p>
        <p className="text-xs text-ink-soft">out of 100; a practice aid, not a verdict</p>
      </div>
      <table className="mt-2 w-full text-sm">
        <caption className="sr-only">How the score is built</caption>
        <thead>
          <tr className="text-left text-xs text-ink-soft">
            <th scope="col" className="py-1 pr-2 font-semibold">
              Part
            </th>
            <th scope="col" className="py-1 pr-2 text-right font-semibold">
              Value
            </th>
            <th scope="col" className="py-1 pr-2 text-right font-semibold">
              Weight
            </th>
            <th scope="col" className="py-1 text-right font-semibold">
              Points
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.part} className="border-t border-line/70" data-testid="score-part">
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                <span className="font-semibold">{r.label}</span>
                <span className="block text-xs text-ink-soft">{r.what}</span>
              </th>
              <td className="py-1 pr-2 text-right tabular-nums">{percent(r.value)}</td>
              <td className="py-1 pr-2 text-right tabular-nums">× {Math.round(r.weight * 100)}</td>
              <td className="py-1 text-right font-semibold tabular-nums">{r.points.toFixed(1)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
