import { Button } from "~/components/Button";
import { clock } from "~/utils/noteText";
import type { PlaybackState } from "./usePlayback";

export const SPEEDS = [0.5, 0.75, 1] as const;

/** Play the take or the smoother path, loop the selected change, pause, stop, slow down. */
export function PracticeControls({
  state,
  available,
  durationSec,
  speed,
  onSpeed,
  loopLabel,
  onPlayTake,
  onPlaySmoother,
  onLoop,
  onPause,
  onResume,
  onStop,
}: {
  state: PlaybackState;
  available: boolean;
  durationSec: number;
  speed: number;
  onSpeed: (speed: number) => void;
  /** "change 3", or null when no change is selected */
  loopLabel: string | null;
  onPlayTake: () => void;
  onPlaySmoother: () => void;
  onLoop: () => void;
  onPause: () => void;
  onResume: () => void;
  onStop: () => void;
}) {
  const playing = state.mode !== null;
  const ring = (on: boolean) => (on ? "ring-2 ring-tide ring-offset-2" : "");
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <Button
          type="button"
          onClick={onPlayTake}
          disabled={!available}
          aria-pressed={state.mode === "take"}
          className={ring(state.mode === "take")}
        >
          <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
            <path d="M2 1l9 5-9 5z" />
          </svg>
          Play take
        </Button>
        <Button
          type="button"
          variant="secondary"
          onClick={onPlaySmoother}
          disabled={!available}
          aria-pressed={state.mode === "smoother"}
          className={ring(state.mode === "smoother")}
        >
          Hear the smoother path
        </Button>
        <Button
          type="button"
          variant="secondary"
          onClick={onLoop}
          disabled={!available || loopLabel === null}
          aria-pressed={state.mode === "loop"}
          className={ring(state.mode === "loop")}
        >
          {loopLabel ? `Loop ${loopLabel}` : "Loop a change"}
        </Button>
        {state.paused ? (
          <Button type="button" variant="quiet" onClick={onResume} disabled={!playing}>
            Resume
          </Button>
        ) : (
          <Button type="button" variant="quiet" onClick={onPause} disabled={!playing}>
            <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
              <rect x="2" y="2" width="3" height="8" />
              <rect x="7" y="2" width="3" height="8" />
            </svg>
            Pause
          </Button>
        )}
        <Button type="button" variant="quiet" onClick={onStop} disabled={!playing}>
          <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
            <rect x="2" y="2" width="8" height="8" />
          </svg>
          Stop
        </Button>
        <fieldset className="flex items-center gap-1 text-sm">
          <legend className="sr-only">Speed</legend>
          <span aria-hidden="true" className="mr-1 text-ink-soft">
            Speed
          </span>
          {SPEEDS.map((s) => (
            <label
              key={s}
              className={`cursor-pointer rounded-md border px-2 py-1 has-[:focus-visible]:ring-2 has-[:focus-visible]:ring-tide ${speed === s ? "border-tide bg-tide-pale font-semibold" : "border-line bg-card"}`}
            >
              <input
                type="radio"
                name="speed"
                value={s}
                checked={speed === s}
                onChange={() => onSpeed(s)}
                className="sr-only"
              />
              {Math.round(s * 100)}%
            </label>
          ))}
        </fieldset>
      </div>
      <p role="status" className="text-sm text-ink-soft" data-testid="playback-status">
        {state.error
          ? state.error
          : playing
            ? `${state.paused ? "Paused" : state.sound === "loading" ? "Loading the piano for" : "Playing"} ${state.label ?? ""}${state.mode !== "snippet" && state.mode !== "loop" && state.time !== null ? ` · ${clock(state.time)} of ${clock(durationSec)}` : ""}${state.sound === "synth" ? " (on the simple synth: the piano could not load)" : ""}`
            : available
              ? "A recorded grand piano plays in your browser; use headphones to hear the voices clearly."
              : "Playback starts once the page has loaded."}
      </p>
    </div>
  );
}
