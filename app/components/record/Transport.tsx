import { useId } from "react";
import { Button } from "~/components/Button";
import { clock } from "~/utils/noteText";
import type { Phase } from "./useRecording";

export type TransportSettings = { countIn: boolean; clicks: boolean; bpm: number };

/** Count-in, metronome and tempo, then record/stop with the running time. */
export function Transport({
  phase,
  settings,
  onSettings,
  elapsed,
  countBeat,
  canRecord,
  onRecord,
  onStop,
}: {
  phase: Phase;
  settings: TransportSettings;
  onSettings: (next: TransportSettings) => void;
  elapsed: number;
  countBeat: number | null;
  canRecord: boolean;
  onRecord: () => void;
  onStop: () => void;
}) {
  const id = useId();
  const running = phase === "counting" || phase === "recording";
  const locked = phase !== "idle";
  return (
    <div className="flex flex-col gap-3">
      <fieldset className="flex flex-wrap items-center gap-x-5 gap-y-2 text-sm" disabled={locked}>
        <legend className="sr-only">Recording settings</legend>
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={settings.countIn}
            onChange={(e) => onSettings({ ...settings, countIn: e.target.checked })}
            className="h-4 w-4 accent-tide"
          />
          Count in one bar
        </label>
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={settings.clicks}
            onChange={(e) => onSettings({ ...settings, clicks: e.target.checked })}
            className="h-4 w-4 accent-tide"
          />
          Metronome while recording
        </label>
        <span className="flex items-center gap-2">
          <label htmlFor={`${id}-bpm`}>Tempo</label>
          <input
            id={`${id}-bpm`}
            type="number"
            min={30}
            max={240}
            value={settings.bpm}
            onChange={(e) => onSettings({ ...settings, bpm: Number(e.target.value) || settings.bpm })}
            // Enter inside the upload page's form would submit it.
            onKeyDown={(e) => e.key === "Enter" && e.preventDefault()}
            className="w-20 rounded-md border border-line bg-white px-2 py-1 text-base shadow-inner focus:border-tide"
          />
          <span className="text-ink-soft">bpm</span>
        </span>
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        {running ? (
          <Button type="button" variant="danger" onClick={onStop}>
            <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
              <rect x="2" y="2" width="8" height="8" />
            </svg>
            Stop
          </Button>
        ) : (
          <Button type="button" onClick={onRecord} disabled={!canRecord || phase !== "idle"}>
            <svg aria-hidden="true" viewBox="0 0 12 12" className="h-3 w-3 fill-current">
              <circle cx="6" cy="6" r="5" />
            </svg>
            Record
          </Button>
        )}
        <p role="status" className="text-sm" data-testid="record-status">
          {phase === "counting" ? (
            <span className="font-semibold text-ochre">Count-in: {countBeat ?? "…"}</span>
          ) : phase === "recording" ? (
            <span className="flex items-center gap-2 font-semibold text-brick">
              <span aria-hidden="true" className="h-2.5 w-2.5 animate-pulse rounded-full bg-brick" />
              Recording {clock(elapsed)}
            </span>
          ) : phase === "stopped" ? (
            <span className="text-ink-soft">Recording finished.</span>
          ) : (
            <span className="text-ink-soft">{canRecord ? "Ready when you are." : "Connect a keyboard to record."}</span>
          )}
        </p>
      </div>
    </div>
  );
}
