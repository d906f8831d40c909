import { useMemo, useState } from "react";
import { Form, useNavigation } from "react-router";
import { parseKey } from "~/analysis/pitch";
import type { NoteEvent } from "~/analysis/types";
import { Button, buttonClass } from "~/components/Button";
import { checkProgression, targetChordsInKey } from "~/utils/exerciseProgression";
import { fitsFirstChord, modelPath, pathPlan, startForKey } from "~/utils/modelAnswer";
import { noteLabel, pretty } from "~/utils/noteText";
import { takePlan } from "~/browser/playbackPlan";
import { KeyboardPicker } from "./KeyboardPicker";
import { useSynth } from "./useSynth";

type Props = {
  progression: string;
  keys: string[];
  start: number[] | null;
  tempo: number | null;
  canEdit: boolean;
  /** the exercise's focus techniques: the path follows them and says how */
  focus?: string[];
  modelTake: { name: string; notes: NoteEvent[] } | null;
};

/**
 * The smoothest voicing path through the target in each key, from the starting voicing the
 * teacher picked (moved to each key), playable; and the teacher's own model take if attached.
 */
export function ModelAnswer({ progression, keys, start, tempo, canEdit, focus = [], modelTake }: Props) {
  const synth = useSynth();
  const navigation = useNavigation();
  const [keyName, setKeyName] = useState(keys[0]);
  const [picking, setPicking] = useState<number[] | null>(null);
  const valid = checkProgression(progression, keys).ok;

  const result = useMemo(() => {
    if (!valid) return null;
    const chords = targetChordsInKey(progression, keys, keyName);
    const home = parseKey(keys[0]);
    const here = parseKey(keyName);
    const first = picking && keyName === keys[0] ? picking : startForKey(start, home.tonic, here.tonic, chords[0]);
    const fits = fitsFirstChord(first, chords[0]);
    const options = { focus, key: here, teacherStart: fits && (picking !== null || !!start?.length) };
    return {
      chords,
      path: modelPath(chords, fits ? first : startForKey(null, 0, 0, chords[0]), options),
      fits,
      key: here,
      first,
    };
  }, [valid, progression, keys, keyName, start, picking, focus]);

  if (!result)
    return <p className="text-sm text-ink-soft">The progression cannot be read, so there is no model answer yet.</p>;
  const { path, key, fits } = result;
  // One range for every chord of the path, whole octaves from C to B, so the cards line up.
  const all = path.steps.flatMap((s) => s.voicing);
  const low = Math.min(...all);
  const high = Math.max(...all);
  const range = { low: low - (((low % 12) + 12) % 12), high: high + (11 - (((high % 12) + 12) % 12)) };
  const toggle = (m: number) => {
    const current = picking ?? result.first;
    setPicking(current.includes(m) ? current.filter((n) => n !== m) : [...current, m].sort((a, b) => a - b));
  };

  return (
    <div className="flex flex-col gap-4">
      {keys.length > 1 ? (
        <div role="tablist" aria-label="Key" className="flex flex-wrap gap-1">
          {keys.map((k) => (
            <button
              key={k}
              type="button"
              role="tab"
              aria-selected={k === keyName}
              onClick={() => setKeyName(k)}
              className={`rounded-md border px-2.5 py-1 text-sm ${k === keyName ? "border-tide bg-tide text-white" : "border-line bg-white hover:border-tide"}`}
            >
              {pretty(k)}
            </button>
          ))}
        </div>
      ) : null}

      <ol className="flex flex-wrap gap-3" aria-label={`Smoothest path in ${pretty(keyName)}`} data-testid="model-path">
        {path.steps.map((s, i) => (
          <li key={i} className="rounded-md border border-line bg-white p-2 text-center text-sm">
            <div className="font-semibold">
              {pretty(s.symbol)}{" "}
              {s.roman ? <span className="text-xs font-normal text-tide-dark">{pretty(s.roman)}</span> : null}
            </div>
            <div className="text-xs text-ink-soft">
              {s.grace != null ? <span title="grace note">({noteLabel(s.grace, key)}) </span> : null}
              {s.voicing.map((n) => noteLabel(n, key)).join(" ")}
            </div>
            <KeyboardPicker
              notes={s.voicing}
              low={range.low}
              high={range.high}
              label={`${s.symbol}: ${s.voicing.map((n) => noteLabel(n, key)).join(", ")}`}
            />
            <div className="text-xs text-ink-soft">
              {s.motion === null ? "start" : `moves ${s.motion} semitone${s.motion === 1 ? "" : "s"}`}
            </div>
          </li>
        ))}
      </ol>
      {path.choices?.length ? (
        <div className="text-sm">
          <h3 className="font-semibold">Why it is voiced this way</h3>
          <ul className="mt-1 list-disc space-y-1 pl-5" data-testid="model-choices">
            {path.choices.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <span>
          Total motion <strong data-testid="model-total">{path.totalMotion}</strong> semitones
        </span>
        {synth.available ? (
          synth.playing === "path" ? (
            <button type="button" className={buttonClass("secondary")} onClick={synth.stop}>
              Stop
            </button>
          ) : (
            <button
              type="button"
              className={buttonClass("secondary")}
              onClick={() => synth.play("path", pathPlan(path.steps, tempo))}
            >
              Play the smoothest path
            </button>
          )
        ) : null}
        {synth.error ? <span className="text-brick">{synth.error}</span> : null}
      </div>

      {canEdit && keyName === keys[0] ? (
        <Form method="post" className="flex flex-col gap-2 rounded-md border border-dashed border-line p-3">
          <p className="text-sm">
            <strong>Starting voicing.</strong> Press keys to choose how the first chord (
            {pretty(result.chords[0].symbol)}) is voiced; the path follows from it in every key.
          </p>
          <KeyboardPicker
            notes={picking ?? result.first}
            low={48}
            high={83}
            label="Pick the starting voicing"
            onToggle={toggle}
          />
          {!fits ? (
            <p className="text-sm text-brick">
              Use exactly the tones of {pretty(result.chords[0].symbol)}
              {result.chords[0].bass !== null ? ", its bass lowest" : ""}.
            </p>
          ) : null}
          <input type="hidden" name="intent" value="model-start" />
          <input type="hidden" name="notes" value={(picking ?? result.first).join(",")} />
          <div>
            <Button
              variant="secondary"
              disabled={!fits || picking === null}
              pending={navigation.state === "submitting"}
            >
              Save starting voicing
            </Button>
          </div>
        </Form>
      ) : null}

      {modelTake ? (
        <div className="flex flex-wrap items-center gap-3 text-sm">
          <span>
            Model take: <strong>{modelTake.name}</strong>
          </span>
          {synth.available ? (
            <button
              type="button"
              className={buttonClass("secondary")}
              onClick={() => (synth.playing === "take" ? synth.stop() : synth.play("take", takePlan(modelTake.notes)))}
            >
              {synth.playing === "take" ? "Stop" : "Play the model take"}
            </button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
