import { useId, useState } from "react";
import { pretty } from "~/utils/noteText";

export type ExerciseChoice = { id: string; title: string; keys: string[] };

/** Keys a take without an exercise can be read in; "" lets Nearnote estimate it from the notes. */
export const ALL_KEYS = [
  "C",
  "G",
  "D",
  "A",
  "E",
  "B",
  "F#",
  "Db",
  "Ab",
  "Eb",
  "Bb",
  "F",
  "Am",
  "Em",
  "Bm",
  "F#m",
  "C#m",
  "G#m",
  "Ebm",
  "Bbm",
  "Fm",
  "Cm",
  "Gm",
  "Dm",
];

const selectClass =
  "rounded-md border border-line bg-white px-3 py-2 text-base text-ink shadow-inner focus:border-tide";

/**
 * The exercise a take is for, and its key. The key list follows the exercise (its own
 * keys); without an exercise any key may be named, or none. Without JavaScript the
 * first key option ("the exercise's key") is always valid, so a changed exercise still posts.
 */
export function ExerciseKeyFields({
  exercises,
  defaultExerciseId = "",
  defaultKey = "",
  stacked = false,
}: {
  exercises: ExerciseChoice[];
  defaultExerciseId?: string;
  defaultKey?: string;
  /** one field under the other, for narrow columns */
  stacked?: boolean;
}) {
  const id = useId();
  const [exerciseId, setExerciseId] = useState(defaultExerciseId);
  const [key, setKey] = useState(defaultKey);
  const exercise = exercises.find((e) => e.id === exerciseId);
  const keys = exercise ? exercise.keys : ALL_KEYS;
  return (
    <div className={`grid gap-4 ${stacked ? "" : "sm:grid-cols-[2fr_1fr]"}`}>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-exercise`} className="text-sm font-semibold">
          Exercise
        </label>
        <select
          id={`${id}-exercise`}
          name="exerciseId"
          value={exerciseId}
          onChange={(e) => {
            setExerciseId(e.target.value);
            setKey("");
          }}
          className={`${selectClass} w-full min-w-0`}
        >
          <option value="">Free practice (no exercise)</option>
          {exercises.map((e) => (
            <option key={e.id} value={e.id}>
              {e.title}
            </option>
          ))}
        </select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-key`} className="text-sm font-semibold">
          Key
        </label>
        <select
          id={`${id}-key`}
          name="key"
          value={key}
          onChange={(e) => setKey(e.target.value)}
          className={`${selectClass} w-full min-w-0`}
        >
          <option value="">
            {exercise ? `The exercise's key (${pretty(exercise.keys[0] ?? "")})` : "Work it out from the notes"}
          </option>
          {keys.map((k) => (
            <option key={k} value={k}>
              {pretty(k.endsWith("m") ? `${k.slice(0, -1)} minor` : `${k} major`)}
            </option>
          ))}
        </select>
      </div>
    </div>
  );
}
