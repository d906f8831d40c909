import { useState } from "react";
import { useFetcher } from "react-router";
import { failureMessage, failureOf } from "~/forms/failure";
import type { action as feedbackAction } from "~/routes/takes.$takeId.feedback";
import type { FlagName, TakeAnalysis } from "~/analysis/types";
import { Button } from "~/components/Button";
import { FLAG_TITLES } from "~/takes/explainFlags";
import { pretty } from "~/utils/noteText";

export type IntendedItem = {
  id: string;
  on: "chord" | "change";
  idx: number;
  flag: string;
  reason: string;
  byName: string | null;
};

type FlagSpot = { on: "chord" | "change"; idx: number; flag: string; where: string };

/** Every flag of the take with where it sits, in the take's order. */
export function flagSpots(analysis: Pick<TakeAnalysis, "chords" | "changes">): FlagSpot[] {
  const name = (i: number) => pretty(analysis.chords[i]?.symbol ?? (analysis.chords[i]?.noteNames.join(" ") || "?"));
  const spots: FlagSpot[] = [];
  analysis.changes.forEach((c, i) => {
    for (const f of c.flags)
      spots.push({ on: "change", idx: i, flag: f, where: `Change ${i + 1}: ${name(c.from)} → ${name(c.to)}` });
  });
  analysis.chords.forEach((c, i) => {
    for (const f of c.flags) spots.push({ on: "chord", idx: i, flag: f, where: `Chord ${i + 1}: ${name(i)}` });
  });
  return spots;
}

function IntendToggle({
  takeId,
  spot,
  mark,
  asTeacher,
}: {
  takeId: string;
  spot: FlagSpot;
  mark: IntendedItem | undefined;
  asTeacher: boolean;
}) {
  const fetcher = useFetcher<typeof feedbackAction>();
  const error = failureMessage(failureOf(fetcher.data));
  if (mark) {
    return (
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <span className="rounded bg-moss-pale px-2 py-0.5 text-moss" data-testid="intended-reason">
          Intended{mark.byName ? ` (${mark.byName})` : ""}: “{mark.reason}” · not counted in the score
        </span>
        {asTeacher ? (
          <fetcher.Form method="post" action={`/takes/${takeId}/feedback`}>
            <input type="hidden" name="intent" value="unintend" />
            <input type="hidden" name="markId" value={mark.id} />
            <Button variant="quiet" pending={fetcher.state !== "idle"}>
              Count it again
            </Button>
          </fetcher.Form>
        ) : null}
      </div>
    );
  }
  if (!asTeacher) return null;
  return (
    <fetcher.Form method="post" action={`/takes/${takeId}/feedback`} className="flex flex-wrap items-end gap-2">
      <input type="hidden" name="intent" value="intend" />
      <input type="hidden" name="on" value={spot.on} />
      <input type="hidden" name="idx" value={spot.idx} />
      <input type="hidden" name="flag" value={spot.flag} />
      <label className="flex flex-col gap-1 text-xs">
        <span className="sr-only">Why it was intended</span>
        <input
          name="reason"
          required
          maxLength={300}
          placeholder="Why, e.g. I asked for this leap"
          className="w-64 rounded-md border border-line bg-white px-2 py-1 text-sm"
        />
      </label>
      <Button variant="secondary" pending={fetcher.state !== "idle"}>
        I asked for this
      </Button>
      {error ? (
        <span role="alert" className="text-sm text-brick">
          {error}
        </span>
      ) : null}
    </fetcher.Form>
  );
}

/** The take's flags, each with the teacher's "I asked for this" and the reason once marked. */
export function IntendedFlags({
  takeId,
  analysis,
  marks,
  asTeacher,
  score,
  engineScore,
}: {
  takeId: string;
  analysis: Pick<TakeAnalysis, "chords" | "changes" | "summary">;
  marks: IntendedItem[];
  asTeacher: boolean;
  score: number | null;
  /** the engine's own score, before intended flags were left out */
  engineScore: number | null;
}) {
  const [all, setAll] = useState(false);
  const spots = flagSpots(analysis);
  if (spots.length === 0) return <p className="text-sm text-ink-soft">No flags on this take.</p>;
  const markOf = (s: FlagSpot) => marks.find((m) => m.on === s.on && m.idx === s.idx && m.flag === s.flag);
  // A long take can carry thousands of flags: the first ones (and every marked one) are listed until asked for all.
  const shown = all ? spots : spots.filter((s, i) => i < FIRST_SPOTS || markOf(s));
  const changed = score !== null && engineScore !== null && score !== engineScore;
  return (
    <div className="flex flex-col gap-3">
      {changed ? (
        <p className="text-sm" data-testid="intended-score">
          Score <strong>{Math.round(score!)}</strong> with the intended flags left out (the engine gave {engineScore}).
        </p>
      ) : null}
      <ul className="flex flex-col gap-3">
        {shown.map((s) => (
          <li key={`${s.on}-${s.idx}-${s.flag}`} className="flex flex-col gap-1 border-b border-line/60 pb-2">
            <span className="text-sm">
              <strong>{FLAG_TITLES[s.flag as FlagName] ?? s.flag}</strong> · {s.where}
            </span>
            <IntendToggle takeId={takeId} spot={s} mark={markOf(s)} asTeacher={asTeacher} />
          </li>
        ))}
      </ul>
      {shown.length < spots.length ? (
        <Button type="button" variant="secondary" className="self-start" onClick={() => setAll(true)}>
          Show all {spots.length} flags
        </Button>
      ) : null}
    </div>
  );
}

const FIRST_SPOTS = 30;
