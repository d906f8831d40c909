import { ExerciseChoiceOptions, type FileExerciseOption } from "./FileExerciseSelect";

/** How many groups of files the no-JavaScript form offers, each with its own exercise. */
export const FILE_GROUPS = 3;

/**
 * Without JavaScript a browser's file picker cannot ask about each file, so the upload form
 * also offers groups: the files picked in a group go to that group's exercise (fields `file-N`
 * and `exercise-N`, read by the page's action). Inside <noscript>: with scripts each file
 * gets its own choice in the list of files instead.
 */
export function FileGroups({ exercises, idPrefix }: { exercises: FileExerciseOption[]; idPrefix: string }) {
  if (exercises.length === 0) return null;
  return (
    <noscript>
      <fieldset className="flex min-w-0 flex-col gap-3 rounded-lg border border-line bg-paper px-4 py-3">
        <legend className="px-1 text-sm font-semibold">Files for other exercises</legend>
        <p className="text-sm text-ink-soft">
          The files chosen above go to the exercise at the top of the page. For takes of other exercises, choose the
          exercise in a group, then that group&rsquo;s files.
        </p>
        {Array.from({ length: FILE_GROUPS }, (_, n) => (
          <div
            key={n}
            className="grid min-w-0 gap-2 border-t border-line pt-3 sm:grid-cols-[minmax(0,1fr)_minmax(0,1fr)] sm:gap-4"
          >
            <div className="flex min-w-0 flex-col gap-1">
              <label htmlFor={`${idPrefix}-exercise-${n}`} className="text-sm font-semibold">
                Group {n + 1}: exercise
              </label>
              <select
                id={`${idPrefix}-exercise-${n}`}
                name={`exercise-${n}`}
                defaultValue=""
                className="w-full min-w-0 rounded-md border border-line bg-white px-3 py-2 text-base text-ink shadow-inner focus:border-tide"
              >
                <ExerciseChoiceOptions exercises={exercises} asAbove="Same as above" />
              </select>
            </div>
            <div className="flex min-w-0 flex-col gap-1">
              <label htmlFor={`${idPrefix}-file-${n}`} className="text-sm font-semibold">
                Group {n + 1}: files
              </label>
              <input
                id={`${idPrefix}-file-${n}`}
                type="file"
                name={`file-${n}`}
                multiple
                accept=".mid,.midi,audio/midi,audio/x-midi"
                className="w-full max-w-full min-w-0 text-sm file:mr-3 file:rounded-md file:border file:border-line file:bg-card file:px-3 file:py-2 file:font-semibold"
              />
            </div>
          </div>
        ))}
      </fieldset>
    </noscript>
  );
}
