import type { ChordReport, Summary, TechniqueName } from "~/analysis/types";
import { TECHNIQUES } from "~/analysis/types";
import { percent, pretty } from "~/utils/noteText";
import { mismatchWords, TECHNIQUE_WORDS } from "~/takes/takeWords";
import { ScoreExplained } from "./ScoreExplained";

function Figure({
  label,
  value,
  detail,
  tone = "ink",
}: {
  label: string;
  value: string;
  detail?: string;
  tone?: "ink" | "moss" | "ochre" | "brick";
}) {
  const colour = { ink: "text-ink", moss: "text-moss", ochre: "text-ochre", brick: "text-brick" }[tone];
  return (
    <div className="rounded-md border border-line bg-white px-4 py-3">
      <dt className="text-xs font-semibold uppercase tracking-wide text-ink-soft">{label}</dt>
      <dd className={`text-2xl font-semibold ${colour}`}>{value}</dd>
      {detail ? <dd className="text-xs text-ink-soft">{detail}</dd> : null}
    </div>
  );
}

const MISMATCHES_SHOWN = 8;

/** The take in a few figures: score, smoothness, motion, leaps, techniques, and the exercise match. */
export function TakeSummary({ summary, chords }: { summary: Summary; chords: ChordReport[] }) {
  const used = TECHNIQUES.filter((t) => summary.techniques[t] > 0);
  const smoothTone = summary.smoothness >= 0.8 ? "moss" : summary.smoothness >= 0.5 ? "ochre" : "brick";
  const mismatches = summary.mismatches ?? [];
  return (
    <div className="flex flex-col gap-4">
      <div className="grid items-start gap-3 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <ScoreExplained score={summary.score} parts={summary.scoreParts} />
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-3" aria-label="Take summary">
          <Figure
            label="Smoothness"
            value={percent(summary.smoothness)}
            tone={smoothTone}
            detail={`best ${summary.bestTotalMotion} ÷ played ${summary.totalMotion} semitones`}
          />
          <Figure
            label="Motion"
            value={`${summary.totalMotion}`}
            detail={`semitones over ${summary.gradedChangeCount} changes; ${summary.bestTotalMotion} was possible`}
          />
          <Figure
            label="Root-position leaps"
            value={`${summary.rootPositionLeaps}`}
            tone={summary.rootPositionLeaps === 0 ? "moss" : "brick"}
            detail={
              summary.rootPositionLeaps === 0 ? "no whole-hand jumps" : "whole-hand jumps between root-position chords"
            }
          />
          {summary.accuracy !== undefined ? (
            <Figure
              label="Exercise accuracy"
              value={percent(summary.accuracy)}
              tone={summary.accuracy >= 0.8 ? "moss" : "ochre"}
              detail={
                summary.loops && summary.loops > 1
                  ? `target played through ${summary.loops} times`
                  : "target chords played in order"
              }
            />
          ) : (
            <Figure label="Exercise accuracy" value="–" detail="free practice: no target chords to compare with" />
          )}
          <Figure
            label="Chords"
            value={`${summary.chordCount}`}
            detail={`${summary.melodyNoteCount} single melody notes besides`}
          />
          <Figure
            label="Key"
            value={pretty(summary.key)}
            detail={
              summary.keySource === "given"
                ? summary.target
                  ? "from the exercise"
                  : "as given with the take"
                : "estimated from the notes"
            }
          />
          <Figure
            label="Steady time"
            value={percent(summary.tempo.steadiness)}
            detail="how evenly your notes fell on the beat"
          />
        </dl>
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <section aria-labelledby="techniques-heading">
          <h3 id="techniques-heading" className="font-semibold">
            Techniques used
          </h3>
          {used.length === 0 ? (
            <p className="text-sm text-ink-soft">
              None yet: plain root-position triads throughout. Try an inversion on the next change.
            </p>
          ) : (
            <ul className="mt-1 flex flex-col gap-1 text-sm">
              {used.map((t: TechniqueName) => (
                <li key={t}>
                  <strong>{TECHNIQUE_WORDS[t].label}</strong>
                  {t === "smooth-top-line"
                    ? ""
                    : ` (${summary.techniques[t]} chord${summary.techniques[t] === 1 ? "" : "s"})`}
                  : <span className="text-ink-soft">{TECHNIQUE_WORDS[t].text}</span>
                </li>
              ))}
            </ul>
          )}
        </section>
        {summary.target !== undefined ? (
          <section aria-labelledby="match-heading">
            <h3 id="match-heading" className="font-semibold">
              Against the exercise: <span className="font-normal">{pretty(summary.target)}</span>
            </h3>
            {mismatches.length === 0 ? (
              <p className="text-sm text-moss">Every target chord played, in order.</p>
            ) : (
              <ul className="mt-1 flex flex-col gap-1 text-sm">
                {mismatches.slice(0, MISMATCHES_SHOWN).map((m, i) => (
                  <li key={i}>{mismatchWords(m, chords, summary.loops ?? 1)}</li>
                ))}
                {mismatches.length > MISMATCHES_SHOWN ? (
                  <li className="text-ink-soft">and {mismatches.length - MISMATCHES_SHOWN} more.</li>
                ) : null}
              </ul>
            )}
          </section>
        ) : null}
      </div>
    </div>
  );
}
