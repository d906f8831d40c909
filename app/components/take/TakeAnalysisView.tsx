import { useEffect, useMemo, useState, type ReactNode } from "react";
import type { NoteEvent, TakeAnalysis } from "~/analysis/types";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { keyOf, pretty } from "~/lib/noteText";
import { chordIndexAt, smootherPathPlan, takePlan } from "~/lib/playbackPlan";
import { ChangeDetail } from "./ChangeDetail";
import { ChangeList } from "./ChangeList";
import { ChordStrip } from "./ChordStrip";
import { placeMismatches, stripMarks } from "~/lib/mismatchPlaces";
import { PianoRoll, PianoRollLegend } from "./PianoRoll";
import { PlaybackBar } from "./PlaybackBar";
import { TakeSummary } from "./TakeSummary";
import { usePlayback } from "./usePlayback";

/** The first flagged change is where a student's attention should go first. */
function firstToLookAt(analysis: TakeAnalysis): number | null {
  if (analysis.changes.length === 0) return null;
  const flagged = analysis.changes.findIndex((c) => c.flags.length > 0 || analysis.chords[c.to]?.flags.length);
  return flagged === -1 ? 0 : flagged;
}

/** The analysed take: summary, piano roll with playback, chord strip, changes and the selected change. */
export function TakeAnalysisView({
  analysis,
  notes,
  durationSec,
  changeExtras,
}: {
  analysis: TakeAnalysis;
  notes: NoteEvent[];
  durationSec: number;
  /** Shown under the selected change (comments pinned to it). */
  changeExtras?: (index: number) => ReactNode;
}) {
  const { chords, changes, summary } = analysis;
  const keyInfo = useMemo(() => keyOf(summary.key), [summary.key]);
  const [selected, setSelected] = useState<number | null>(() => firstToLookAt(analysis));
  // Differences from the exercise's target, at their places in the chord strip.
  const marks = useMemo(() => stripMarks(placeMismatches(analysis)), [analysis]);
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
  const sounding = (state.mode === "take" || state.mode === "smoother") && state.time !== null ? chordIndexAt(chords, state.time) : -1;
  const rollTime = state.mode === "take" || state.mode === "smoother" ? state.time : null;
  const length = Math.max(durationSec, summary.durationSec);

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
      <Card title="How it went">
        <TakeSummary summary={summary} chords={chords} />
      </Card>

      <Card title="Piano roll" actions={<span className="text-sm text-ink-soft">{chords.length} chords · {changes.length} changes</span>}>
        <div className="mb-3">
          <PlaybackBar
            state={state}
            available={playback.available}
            durationSec={length}
            onPlayTake={() => playback.play("take", takePlan(notes), "the take")}
            onPlaySmoother={() => playback.play("smoother", smootherPathPlan(chords, changes, analysis.melodyNotes), "the smoother path")}
            onStop={playback.stop}
          />
        </div>
        <PianoRoll notes={notes} chords={chords} changes={changes} durationSec={length} selected={selected} onSelect={setSelected} playTime={rollTime} sounding={sounding >= 0 ? sounding : null} />
        <PianoRollLegend />
      </Card>

      <Card title={`Chords in ${pretty(summary.key)}`} actions={<span className="text-sm text-ink-soft">top line drawn above</span>}>
        <ChordStrip
          chords={chords}
          changes={changes}
          keyName={summary.key}
          selected={selected}
          sounding={sounding >= 0 ? sounding : null}
          onSelect={setSelected}
          marks={marks}
        />
      </Card>

      <div className="grid items-start gap-6 lg:grid-cols-[3fr_2fr]">
        <Card title="Change by change">
          {changes.length === 0 ? (
            <p className="text-sm text-ink-soft">A single chord has no changes to grade.</p>
          ) : (
            <ChangeList chords={chords} changes={changes} keyInfo={keyInfo} selected={selected} onSelect={setSelected} />
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
