import type { Key } from "~/analysis/pitch";
import type { ChangeReport, ChordReport, Suggestion } from "~/analysis/types";
import { Button } from "~/components/Button";
import { noteLabel, voicingLabel } from "~/lib/noteText";
import { pairPlan, type PlannedNote } from "~/lib/playbackPlan";
import { chordName } from "./ChangeList";
import { keyboardRange, MiniKeyboard } from "./MiniKeyboard";

const SUGGESTION_WORDS: Record<Suggestion["kind"], string> = {
  smoothest: "Smoothest",
  "keep-top": "Keeps your top note",
  "keep-bass": "Keeps your bass",
};

/**
 * The selected change up close: what was played, drawn on small keyboards with the chord
 * before outlined, and each suggestion drawn the same way with a button to hear it.
 */
export function ChangeDetail({
  index,
  change,
  chords,
  keyInfo,
  canPlay,
  onPlay,
}: {
  index: number;
  change: ChangeReport;
  chords: ChordReport[];
  keyInfo: Key | null;
  canPlay: boolean;
  onPlay: (plan: PlannedNote[], label: string) => void;
}) {
  const from = chords[change.from];
  const to = chords[change.to];
  if (!from || !to) return null;
  const range = keyboardRange([...from.notes, ...to.notes, ...change.suggestions.flatMap((s) => s.voicing)]);
  const names = (v: number[]) => v.map((n) => noteLabel(n, keyInfo)).join(" ");
  return (
    <div className="flex flex-col gap-4" aria-live="polite">
      <div>
        <h3 className="font-semibold">
          Change {index + 1}: {chordName(from)} → {chordName(to)}
        </h3>
        <p className="text-sm text-ink-soft">
          {change.graded
            ? `Played with ${change.motion} semitones of motion; the smallest possible was ${change.bestMotion}. ${change.commonTones} common tone${change.commonTones === 1 ? "" : "s"} kept, largest single move ${change.largestVoiceMove}.`
            : "One of these chords has more than 8 different notes, so this change is not graded."}
        </p>
      </div>
      <figure className="flex flex-col gap-1">
        <figcaption className="text-sm">
          <strong>As played:</strong> {names(to.notes)} <span className="text-ink-soft">(outlined: {names(from.notes)})</span>
        </figcaption>
        <div className="flex flex-wrap items-center gap-3">
          <MiniKeyboard notes={to.notes} ghost={from.notes} range={range} label={`As played: ${names(from.notes)} to ${names(to.notes)}`} />
          {canPlay ? (
            <Button type="button" variant="secondary" onClick={() => onPlay(pairPlan(from.notes, to.notes), `change ${index + 1} as played`)}>
              Play as played
            </Button>
          ) : null}
        </div>
      </figure>
      {change.suggestions.length === 0 ? (
        <p className="rounded-md bg-moss-pale px-3 py-2 text-sm text-moss">Nothing smoother to suggest: this is already the closest voicing.</p>
      ) : (
        change.suggestions.map((s) => (
          <figure key={s.kind} className="flex flex-col gap-1" data-testid="suggestion">
            <figcaption className="text-sm">
              <strong>{SUGGESTION_WORDS[s.kind]}:</strong> {voicingLabel(s.voicing, keyInfo)} ({names(s.voicing)}), moves {s.motion}
            </figcaption>
            <div className="flex flex-wrap items-center gap-3">
              <MiniKeyboard notes={s.voicing} ghost={from.notes} range={range} label={`${SUGGESTION_WORDS[s.kind]}: ${names(s.voicing)}`} />
              {canPlay ? (
                <Button type="button" variant="secondary" onClick={() => onPlay(pairPlan(from.notes, s.voicing), `${SUGGESTION_WORDS[s.kind].toLowerCase()} voicing`)}>
                  Play this
                </Button>
              ) : null}
            </div>
          </figure>
        ))
      )}
    </div>
  );
}
