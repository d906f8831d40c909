import type { Key } from "~/analysis/pitch";
import type { ChangeReport, ChordReport, Suggestion } from "~/analysis/types";
import { Button } from "~/components/Button";
import { voicingLabel } from "~/utils/noteText";
import { pairPlan, type PlannedNote } from "~/browser/playbackPlan";
import { chordName } from "./ChangeList";
import { VoiceLeadingDrawing } from "./VoiceLeadingDrawing";

const SUGGESTION_WORDS: Record<Suggestion["kind"], string> = {
  smoothest: "Smoothest",
  "keep-top": "Keeps your top note",
  "keep-bass": "Keeps your bass",
};

/**
 * The selected change up close: the change as played drawn as voice leading (a line from each
 * note to the note it moved to, with its semitones), each suggestion drawn the same way beside
 * it, and a button to hear each.
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
  // Without suggestions a change that still moved more than its best shows the best voicing (rule 8).
  const suggestions: Suggestion[] =
    change.suggestions.length === 0 &&
    change.bestVoicing &&
    change.motion !== null &&
    change.bestMotion !== null &&
    change.bestMotion < change.motion
      ? [{ kind: "smoothest", voicing: change.bestVoicing, noteNames: [], motion: change.bestMotion }]
      : change.suggestions;
  const all = [...from.notes, ...to.notes, ...suggestions.flatMap((s) => s.voicing)];
  const range = { lo: Math.min(...all), hi: Math.max(...all) };
  const fromName = chordName(from);
  const toName = chordName(to);
  return (
    <div className="flex flex-col gap-4" aria-live="polite">
      <div>
        <h3 className="font-semibold">
          Change {index + 1}: {fromName} → {toName}
        </h3>
        <p className="text-sm text-ink-soft">
          {change.graded
            ? `Played with ${change.motion} semitones of motion; the smallest possible was ${change.bestMotion}. ${change.commonTones} common tone${change.commonTones === 1 ? "" : "s"} kept, largest single move ${change.largestVoiceMove}.`
            : "One of these chords has more than 8 different notes, so this change is not graded."}
        </p>
      </div>
      <div className="flex flex-wrap gap-x-6 gap-y-4">
        <figure className="flex flex-col gap-2">
          <figcaption className="text-sm">
            <strong>As played</strong>, moves {change.motion ?? "–"}
          </figcaption>
          <VoiceLeadingDrawing
            from={from.notes}
            to={to.notes}
            fromName={fromName}
            toName={toName}
            keyInfo={keyInfo}
            range={range}
            label={`Change ${index + 1} as played`}
          />
          {canPlay ? (
            <Button
              type="button"
              variant="secondary"
              className="self-start"
              onClick={() => onPlay(pairPlan(from.notes, to.notes), `change ${index + 1} as played`)}
            >
              Play as played
            </Button>
          ) : null}
        </figure>
        {suggestions.map((s) => (
          <figure key={s.kind} className="flex flex-col gap-2" data-testid="suggestion">
            <figcaption className="text-sm">
              <strong>{SUGGESTION_WORDS[s.kind]}:</strong> {voicingLabel(s.voicing, keyInfo)}, moves {s.motion}
            </figcaption>
            <VoiceLeadingDrawing
              from={from.notes}
              to={s.voicing}
              fromName={fromName}
              toName={toName}
              keyInfo={keyInfo}
              range={range}
              label={SUGGESTION_WORDS[s.kind]}
            />
            {canPlay ? (
              <Button
                type="button"
                variant="secondary"
                className="self-start"
                onClick={() =>
                  onPlay(pairPlan(from.notes, s.voicing), `${SUGGESTION_WORDS[s.kind].toLowerCase()} voicing`)
                }
              >
                Play this
              </Button>
            ) : null}
          </figure>
        ))}
      </div>
      {suggestions.length === 0 ? (
        <p className="rounded-md bg-moss-pale px-3 py-2 text-sm text-moss">
          Nothing smoother to suggest: this is already the closest voicing.
        </p>
      ) : null}
    </div>
  );
}
