import { useEffect, useMemo, useState, type ReactNode } from "react";
import type { Summary } from "~/analysis/types";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { keyOf, pretty } from "~/utils/noteText";
import { chordIndexAt, pairPlan, smootherPathPlan, stretchPlan, takePlan } from "~/browser/playbackPlan";
import { laneMarks } from "~/takes/chordLane";
import type { NextStep } from "~/takes/nextStep";
import { rollLayout } from "~/takes/pianoRoll";
import type { TakeWindow, Timeline } from "~/takes/takeWindows";
import { ChangeDetail } from "./ChangeDetail";
import { ChangeList } from "./ChangeList";
import type { PlacedMismatch } from "~/takes/mismatchPlaces";
import { NextStepPanel } from "./NextStepPanel";
import { PianoRoll, PianoRollLegend } from "./PianoRoll";
import { PracticeControls } from "./PracticeControls";
import { TakeSummary } from "./TakeSummary";
import { usePlayback } from "./usePlayback";
import { useTakeWindows } from "./useTakeWindows";

/** The first chord starting at or after `sec` (binary search over chords in time order). */
function chordFrom(chords: ReadonlyArray<{ startSec: number }>, sec: number): number {
  let lo = 0;
  let hi = chords.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (chords[mid].startSec < sec) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * The analysed take: the next step, the summary with the score explained, the piano roll with
 * its chord lanes and practice controls, the changes and the selected change drawn as voice leading.
 * A long take arrives in windows (see app/takes/takeWindows.ts): the page brings the time line and
 * one window, and the roll, the change list and the selected change ask for the windows they lack.
 */
export function TakeAnalysisView({
  takeId,
  version,
  summary,
  timeline,
  firstWindow,
  step,
  placed,
  initialSelected,
  durationSec,
  commented,
  changeExtras,
}: {
  takeId: string;
  /** names the analysis, so fetched windows are cached while it holds */
  version: string;
  summary: Summary;
  timeline: Timeline;
  firstWindow: TakeWindow;
  /** what to look at first, worked out on the server from the whole take */
  step: NextStep;
  /** differences from the exercise, each at its place among the chords */
  placed: PlacedMismatch[];
  initialSelected: number | null;
  durationSec: number;
  /** changes carrying a teacher's comment */
  commented?: ReadonlySet<number>;
  /** Shown under the selected change (comments pinned to it). */
  changeExtras?: (index: number) => ReactNode;
}) {
  const windows = useTakeWindows(takeId, version, timeline, firstWindow);
  const { known, need, isLoaded } = windows;
  const { chords, changes, notes } = known;
  const keyInfo = useMemo(() => keyOf(summary.key), [summary.key]);
  const [selected, setSelected] = useState<number | null>(initialSelected);
  const length = Math.max(durationSec, summary.durationSec);
  // Differences from the exercise, flags and comments, at their places under the roll (same scale as the roll).
  const pxPerSec = useMemo(
    () => rollLayout([], length, { pxPerSec: Math.max(90, Math.floor(1000 / Math.max(1, length))) }).pxPerSec,
    [length],
  );
  const commentedSet = useMemo(() => commented ?? new Set<number>(), [commented]);
  const marks = useMemo(
    () => laneMarks(chords, changes, placed, commentedSet, pxPerSec, pretty),
    [placed, chords, changes, commentedSet, pxPerSec],
  );
  // The selected change (and the chord it leads to) come in with their window.
  useEffect(() => {
    if (selected !== null) need(selected, selected + 1);
  }, [selected, need]);
  // A link to one change (#change-3, as feedback mail and the feedback panel send) opens that change.
  useEffect(() => {
    const follow = () => {
      const m = /^#change-(\d+)$/.exec(window.location.hash);
      if (!m || Number(m[1]) >= timeline.changeCount) return;
      setSelected(Number(m[1]));
      requestAnimationFrame(() => document.getElementById(`change-${m[1]}`)?.scrollIntoView({ block: "center" }));
    };
    follow();
    window.addEventListener("hashchange", follow);
    return () => window.removeEventListener("hashchange", follow);
  }, [timeline.changeCount]);
  const playback = usePlayback();
  const { state } = playback;
  const timed = state.mode === "take" || state.mode === "smoother" || state.mode === "loop";
  const sounding = timed && state.time !== null ? chordIndexAt(chords, state.time) : -1;
  const rollTime = timed ? state.time : null;
  const open = (i: number) => {
    setSelected(i);
    requestAnimationFrame(() => document.getElementById(`change-row-${i}`)?.scrollIntoView({ block: "center" }));
  };
  const loopChange = selected !== null ? changes[selected] : undefined;

  if (chords.length === 0) {
    return (
      <EmptyState title="No chords in this take">
        Nearnote found {summary.melodyNoteCount} single notes but no two keys pressed together, so there are no changes
        to grade. Play the exercise with both hands, or at least two notes at a time.
      </EmptyState>
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <NextStepPanel
        step={step}
        canPlay={playback.available}
        onOpen={open}
        onPlayFix={() => {
          if ((step.kind === "motion" || step.kind === "flag") && step.fix)
            playback.play("snippet", pairPlan(step.fix.from, step.fix.to), "the fix");
        }}
      />
      <Card title="How it went">
        <TakeSummary summary={summary} chords={chords} />
      </Card>

      <Card
        title="Piano roll"
        actions={
          <span className="text-sm text-ink-soft">
            {chords.length} chords · {changes.length} changes · in {pretty(summary.key)}
          </span>
        }
      >
        <div className="mb-3">
          <PracticeControls
            state={state}
            available={playback.available}
            durationSec={length}
            speed={playback.speed}
            onSpeed={playback.setSpeed}
            loopLabel={loopChange ? `change ${selected! + 1}` : null}
            onPlayTake={() => {
              if (windows.complete) playback.play("take", takePlan(notes), "the take");
              else void windows.loadAll().then((all) => playback.play("take", takePlan(all.notes), "the take"));
            }}
            onPlaySmoother={() => {
              if (windows.complete)
                playback.play("smoother", smootherPathPlan(chords, changes, known.melodyNotes), "the smoother path");
              else
                void windows
                  .loadAll()
                  .then((all) =>
                    playback.play(
                      "smoother",
                      smootherPathPlan(all.chords, all.changes, all.melodyNotes),
                      "the smoother path",
                    ),
                  );
            }}
            onLoop={() => {
              if (!loopChange) return;
              const from = chords[loopChange.from];
              const to = chords[loopChange.to];
              const end = Math.max(to.endSec, to.startSec + 0.3);
              playback.play("loop", stretchPlan(notes, from.startSec, end), `change ${selected! + 1} on a loop`, {
                offset: from.startSec,
                loop: true,
              });
            }}
            onPause={playback.pause}
            onResume={playback.resume}
            onStop={playback.stop}
          />
        </div>
        <PianoRoll
          notes={notes}
          chords={chords}
          changes={changes}
          durationSec={length}
          selected={selected}
          onSelect={setSelected}
          playTime={rollTime}
          sounding={sounding >= 0 ? sounding : null}
          marks={marks}
          ghostAll={state.mode === "smoother"}
          range={timeline.range}
          onView={(from, to) => {
            const a = Math.max(0, chordFrom(chords, from) - 1);
            const b = Math.min(chords.length - 1, chordFrom(chords, to));
            const wanted: number[] = [];
            for (let k = a; k <= b; k += 20) wanted.push(k);
            need(...wanted, b);
          }}
        />
        <PianoRollLegend />
      </Card>

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Change by change">
          {changes.length === 0 ? (
            <p className="text-sm text-ink-soft">A single chord has no changes to grade.</p>
          ) : (
            <>
              <GoToChange count={changes.length} onGo={open} />
              <ChangeList
                chords={chords}
                changes={changes}
                keyInfo={keyInfo}
                selected={selected}
                onSelect={setSelected}
                commented={commentedSet}
                isLoaded={isLoaded}
                onNeed={need}
              />
            </>
          )}
        </Card>
        <Card title="Try it another way" className="lg:sticky lg:top-4">
          {selected !== null && changes[selected] && !isLoaded(selected) ? (
            <p className="text-sm text-ink-soft" role="status">
              Fetching change {selected + 1}…
            </p>
          ) : selected !== null && changes[selected] ? (
            <ChangeDetail
              index={selected}
              change={changes[selected]}
              chords={chords}
              keyInfo={keyInfo}
              canPlay={playback.available}
              onPlay={(plan, label) => playback.play("snippet", plan, label)}
            />
          ) : (
            <p className="text-sm text-ink-soft">Pick a change to see it on the keyboard.</p>
          )}
          {selected !== null && changes[selected] && changeExtras ? changeExtras(selected) : null}
        </Card>
      </div>
    </div>
  );
}

/**
 * "Go to change N": a plain form (without scripts the page opens at that change's window,
 * from the loader's `?change=`); with scripts it selects the change in place.
 */
function GoToChange({ count, onGo }: { count: number; onGo: (index: number) => void }) {
  if (count <= 1) return null;
  return (
    <form
      method="get"
      className="mb-3 flex items-center gap-2 text-sm"
      onSubmit={(e) => {
        const n = Number(new FormData(e.currentTarget).get("change"));
        if (!Number.isInteger(n) || n < 1 || n > count) return;
        e.preventDefault();
        onGo(n - 1);
      }}
    >
      <label className="flex items-center gap-2">
        Go to change
        <input
          name="change"
          type="number"
          min={1}
          max={count}
          required
          className="w-24 rounded-md border border-line bg-white px-2 py-1"
        />
      </label>
      <button type="submit" className="rounded-md border border-line bg-card px-2 py-1 font-semibold hover:border-tide">
        Go
      </button>
    </form>
  );
}
