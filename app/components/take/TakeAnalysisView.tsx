import { useEffect, useMemo, useState, type ReactNode } from "react";
import type { NoteEvent, TakeAnalysis } from "~/analysis/types";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { keyOf, pretty } from "~/lib/noteText";
import { chordIndexAt, pairPlan, smootherPathPlan, stretchPlan, takePlan } from "~/lib/playbackPlan";
import { laneMarks } from "~/lib/chordLane";
import { nextStep } from "~/lib/nextStep";
import { rollLayout } from "~/lib/pianoRoll";
import { ChangeDetail } from "./ChangeDetail";
import { ChangeList } from "./ChangeList";
import { placeMismatches } from "~/lib/mismatchPlaces";
import { NextStepPanel } from "./NextStepPanel";
import { PianoRoll, PianoRollLegend } from "./PianoRoll";
import { PracticeControls } from "./PracticeControls";
import { TakeSummary } from "./TakeSummary";
import { usePlayback } from "./usePlayback";

/** The first flagged change is where a student's attention should go first. */
function firstToLookAt(analysis: TakeAnalysis): number | null {
  if (analysis.changes.length === 0) return null;
  const flagged = analysis.changes.findIndex((c) => c.flags.length > 0 || analysis.chords[c.to]?.flags.length);
  return flagged === -1 ? 0 : flagged;
}

/**
 * The analysed take: the next step, the summary with the score explained, the piano roll with
 * its chord lanes and practice controls, the changes and the selected change drawn as voice leading.
 */
export function TakeAnalysisView({
  analysis,
  notes,
  durationSec,
  heardKey = null,
  commented,
  intended = [],
  changeExtras,
}: {
  analysis: TakeAnalysis;
  notes: NoteEvent[];
  durationSec: number;
  /** the key the notes suggest, whatever key the take was given */
  heardKey?: string | null;
  /** changes carrying a teacher's comment */
  commented?: ReadonlySet<number>;
  /** flags the teacher marked as intended */
  intended?: ReadonlyArray<{ on: "chord" | "change"; idx: number; flag: string }>;
  /** Shown under the selected change (comments pinned to it). */
  changeExtras?: (index: number) => ReactNode;
}) {
  const { chords, changes, summary } = analysis;
  const keyInfo = useMemo(() => keyOf(summary.key), [summary.key]);
  const step = useMemo(() => nextStep(analysis, heardKey, keyInfo, intended), [analysis, heardKey, keyInfo, intended]);
  const [selected, setSelected] = useState<number | null>(() => firstToLookAt(analysis));
  const length = Math.max(durationSec, summary.durationSec);
  // Differences from the exercise, flags and comments, at their places under the roll (same scale as the roll).
  const pxPerSec = useMemo(() => rollLayout(notes, length, { pxPerSec: Math.max(90, Math.floor(1000 / Math.max(1, length))) }).pxPerSec, [notes, length]);
  const commentedSet = useMemo(() => commented ?? new Set<number>(), [commented]);
  const marks = useMemo(
    () => laneMarks(chords, changes, placeMismatches(analysis), commentedSet, pxPerSec, pretty),
    [analysis, chords, changes, commentedSet, pxPerSec],
  );
  // A link to one change (#change-3, as feedback mail and the feedback panel send) opens that change.
  useEffect(() => {
    const follow = () => {
      const m = /^#change-(\d+)$/.exec(window.location.hash);
      if (!m || Number(m[1]) >= analysis.changes.length) return;
      setSelected(Number(m[1]));
      requestAnimationFrame(() => document.getElementById(`change-${m[1]}`)?.scrollIntoView({ block: "center" }));
    };
    follow();
    window.addEventListener("hashchange", follow);
    return () => window.removeEventListener("hashchange", follow);
  }, [analysis.changes.length]);
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
        Nearnote found {summary.melodyNoteCount} single notes but no two keys pressed together, so there are no changes to
        grade. Play the exercise with both hands, or at least two notes at a time.
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
          if ((step.kind === "motion" || step.kind === "flag") && step.fix) playback.play("snippet", pairPlan(step.fix.from, step.fix.to), "the fix");
        }}
      />
      <Card title="How it went">
        <TakeSummary summary={summary} chords={chords} />
      </Card>

      <Card title="Piano roll" actions={<span className="text-sm text-ink-soft">{chords.length} chords · {changes.length} changes · in {pretty(summary.key)}</span>}>
        <div className="mb-3">
          <PracticeControls
            state={state}
            available={playback.available}
            durationSec={length}
            speed={playback.speed}
            onSpeed={playback.setSpeed}
            loopLabel={loopChange ? `change ${selected! + 1}` : null}
            onPlayTake={() => playback.play("take", takePlan(notes), "the take")}
            onPlaySmoother={() => playback.play("smoother", smootherPathPlan(chords, changes, analysis.melodyNotes), "the smoother path")}
            onLoop={() => {
              if (!loopChange) return;
              const from = chords[loopChange.from];
              const to = chords[loopChange.to];
              const end = Math.max(to.endSec, to.startSec + 0.3);
              playback.play("loop", stretchPlan(notes, from.startSec, end), `change ${selected! + 1} on a loop`, { offset: from.startSec, loop: true });
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
        />
        <PianoRollLegend />
      </Card>

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <Card title="Change by change">
          {changes.length === 0 ? (
            <p className="text-sm text-ink-soft">A single chord has no changes to grade.</p>
          ) : (
            <ChangeList chords={chords} changes={changes} keyInfo={keyInfo} selected={selected} onSelect={setSelected} commented={commentedSet} />
          )}
        </Card>
        <Card title="Try it another way" className="lg:sticky lg:top-4">
          {selected !== null && changes[selected] ? (
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
