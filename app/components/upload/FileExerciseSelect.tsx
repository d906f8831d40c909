import { pretty } from "~/utils/noteText";

export type FileExerciseOption = { id: string; title: string; keys: string[] };

/**
 * Where one file of an upload goes: the exercise chosen above for all files, free practice, or
 * any open exercise in any of its keys. The value is "" (as above), "free" or "exerciseId|key".
 */
export function FileExerciseSelect({
  id,
  fileName,
  exercises,
  fallbackTitle,
  value,
  onChange,
}: {
  id: string;
  fileName: string;
  exercises: FileExerciseOption[];
  /** what "as above" currently means, so the option says it */
  fallbackTitle: string;
  value: string;
  onChange: (value: string) => void;
}) {
  return (
    <div className="flex min-w-0 flex-col gap-1 sm:flex-row sm:items-center sm:gap-3">
      <label htmlFor={id} className="text-sm font-semibold sm:shrink-0">
        Exercise for this file<span className="sr-only"> {fileName}</span>
      </label>
      <select
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="w-full min-w-0 rounded-md border border-line bg-white px-3 py-2 text-base text-ink shadow-inner focus:border-tide sm:w-auto sm:flex-1"
      >
        <ExerciseChoiceOptions exercises={exercises} asAbove={`As above: ${fallbackTitle}`} />
      </select>
    </div>
  );
}

/** The choices for one file or group of files: as above (""), free practice, or an exercise in one of its keys. */
export function ExerciseChoiceOptions({ exercises, asAbove }: { exercises: FileExerciseOption[]; asAbove: string }) {
  return (
    <>
      <option value="">{asAbove}</option>
      <option value="free">Free practice (no exercise)</option>
      {exercises.map((e) =>
        e.keys.map((k) => (
          <option key={`${e.id}|${k}`} value={`${e.id}|${k}`}>
            {e.keys.length > 1 ? `${e.title} · in ${pretty(k)}` : e.title}
          </option>
        )),
      )}
    </>
  );
}
