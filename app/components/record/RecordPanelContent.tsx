import { useEffect, useRef, useState } from "react";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { UploadRows } from "~/components/take/UploadRows";
import { clampBpm } from "~/browser/midiEncode";
import { clock, pretty } from "~/utils/noteText";
import { takePlan } from "~/browser/playbackPlan";
import { createPlayer, type Player } from "~/browser/player.client";
import type { TakeFields } from "~/browser/uploadTake.client";
import { AccessMessage, InputAndKeys } from "./KeyboardStatus";
import { LeaveGuard } from "./LeaveGuard";
import { LiveChordList } from "./LiveChordList";
import { Transport, type TransportSettings } from "./Transport";
import { useMidiInput } from "./useMidiInput";
import { useRecording } from "./useRecording";
import { useRecordingUpload } from "./useRecordingUpload";

export const DEFAULT_RECORD_BPM = 90;

export type RecordPanelProps = {
  exerciseId?: string;
  /** the exercise's key, for live chord names; without it the key is worked out from the notes */
  exerciseKey?: string;
  /** all of the exercise's keys: with more than one, the panel lets the student pick */
  exerciseKeys?: string[];
  /** the exercise's tempo: metronome and count-in */
  tempo?: number | null;
  onUploaded?: (takeId: string) => void;
  /** where "upload a file instead" points */
  uploadHref?: string;
};

/** Fields of the form the panel sits in (the upload page's exercise, key and note), if any. */
function formFields(el: HTMLElement | null): TakeFields {
  const form = el?.closest("form");
  if (!form) return {};
  const data = new FormData(form);
  const text = (name: string) => {
    const v = data.get(name);
    return typeof v === "string" && v.trim() ? v : undefined;
  };
  return { exerciseId: text("exerciseId"), key: text("key"), note: text("note") };
}

/**
 * Record a take from a MIDI keyboard, graded chord by chord while playing, then play it back,
 * discard it or upload it as a Standard MIDI File through the same API as a file upload.
 */
export default function RecordPanelContent({
  exerciseId,
  exerciseKey,
  exerciseKeys,
  tempo,
  onUploaded,
  uploadHref = "/takes/new",
}: RecordPanelProps) {
  const root = useRef<HTMLDivElement>(null);
  const [chosenKey, setChosenKey] = useState<string | undefined>(exerciseKey ?? exerciseKeys?.[0]);
  const [settings, setSettings] = useState<TransportSettings>({
    countIn: true,
    clicks: false,
    bpm: clampBpm(tempo ?? DEFAULT_RECORD_BPM),
  });
  const [keyName, setKeyName] = useState<string | undefined>(exerciseKey);
  const recording = useRecording({ keyName, bpm: settings.bpm, countIn: settings.countIn, clicks: settings.clicks });
  const midi = useMidiInput(recording.onEvent);
  const sender = useRecordingUpload(onUploaded);
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const [playing, setPlaying] = useState(false);
  const player = useRef<Player | null>(null);
  const { phase, take } = recording;

  useEffect(() => () => player.current?.stop(), []);

  const fields = (): TakeFields => {
    const around = formFields(root.current);
    return { exerciseId: exerciseId ?? around.exerciseId, key: chosenKey ?? around.key, note: around.note };
  };

  const record = () => {
    player.current?.stop();
    setPlaying(false);
    sender.reset();
    setConfirmDiscard(false);
    setKeyName(fields().key);
    midi.remember();
    void recording.start();
  };

  const playBack = () => {
    if (!take) return;
    player.current ??= createPlayer();
    setPlaying(true);
    player.current.play(takePlan(take.notes), { onEnd: () => setPlaying(false) }).catch(() => setPlaying(false));
  };

  const stopPlayback = () => {
    player.current?.stop();
    setPlaying(false);
  };

  const discard = () => {
    stopPlayback();
    setConfirmDiscard(false);
    sender.reset();
    recording.discard();
  };

  const running = phase === "counting" || phase === "recording";
  const unsent = phase === "stopped" && !sender.done;
  return (
    <div ref={root}>
      <Card title="Record from your keyboard" data-testid="record-panel">
        <div className="flex flex-col gap-4">
          <AccessMessage
            status={midi.status}
            message={midi.message}
            uploadHref={uploadHref}
            onConnect={() => void midi.connect()}
          />
          {midi.status === "ready" ? (
            <>
              {exerciseKeys && exerciseKeys.length > 1 ? (
                <label className="flex flex-wrap items-center gap-2 text-sm">
                  <span className="font-semibold">Key of this take</span>
                  <select
                    value={chosenKey}
                    disabled={phase !== "idle"}
                    onChange={(e) => setChosenKey(e.target.value)}
                    className="rounded-md border border-line bg-white px-3 py-1.5 text-base shadow-inner focus:border-tide"
                  >
                    {exerciseKeys.map((k) => (
                      <option key={k} value={k}>
                        {pretty(k)}
                      </option>
                    ))}
                  </select>
                </label>
              ) : null}
              <InputAndKeys
                inputs={midi.inputs}
                inputId={midi.inputId}
                onChoose={midi.choose}
                held={recording.held}
                disabled={running}
              />
              <Transport
                phase={phase}
                settings={settings}
                onSettings={setSettings}
                elapsed={recording.elapsed}
                countBeat={recording.countBeat}
                canRecord={midi.inputId !== null && !sender.busy}
                onRecord={record}
                onStop={recording.stop}
              />
            </>
          ) : null}
          {recording.notice ? <p className="text-sm text-ochre">{recording.notice}</p> : null}
          {midi.status === "ready" || recording.live ? (
            <LiveChordList grade={recording.live} recording={running} />
          ) : null}
          {phase === "stopped" && take ? (
            <div className="flex flex-col gap-3 rounded-md border border-line bg-paper p-3">
              <p className="text-sm">
                <span className="font-semibold">{take.file.name}</span> · {clock(take.durationSec)} ·{" "}
                {take.notes.length} notes
              </p>
              <div className="flex flex-wrap items-center gap-3">
                {playing ? (
                  <Button type="button" variant="secondary" onClick={stopPlayback}>
                    Stop playback
                  </Button>
                ) : (
                  <Button type="button" variant="secondary" onClick={playBack}>
                    Play back
                  </Button>
                )}
                {sender.done ? null : confirmDiscard ? (
                  <>
                    <Button type="button" variant="danger" onClick={discard}>
                      Yes, discard it
                    </Button>
                    <Button type="button" variant="quiet" onClick={() => setConfirmDiscard(false)}>
                      Keep it
                    </Button>
                  </>
                ) : (
                  <Button type="button" variant="quiet" onClick={() => setConfirmDiscard(true)} disabled={sender.busy}>
                    Discard
                  </Button>
                )}
                <Button
                  type="button"
                  onClick={() => void sender.upload(take.file, fields())}
                  disabled={sender.done}
                  pending={sender.busy}
                  pendingLabel="Uploading…"
                >
                  {sender.done ? "Uploaded" : "Upload this take"}
                </Button>
                {sender.done ? (
                  <Button type="button" variant="quiet" onClick={discard}>
                    Record another
                  </Button>
                ) : null}
              </div>
            </div>
          ) : null}
          {sender.row ? <UploadRows rows={[sender.row]} /> : null}
        </div>
      </Card>
      <LeaveGuard when={running || unsent} what={running ? "recording" : "unsent"} />
    </div>
  );
}
