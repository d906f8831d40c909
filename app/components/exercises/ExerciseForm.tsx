import { useId, useState } from "react";
import { Form, useNavigation } from "react-router";
import { TECHNIQUES } from "~/analysis/types";
import { Button } from "~/components/Button";
import { Field } from "~/components/Field";
import { ALL_MAJOR_KEYS, ALL_MINOR_KEYS, splitKeys } from "~/utils/exerciseProgression";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";
import { ProgressionPreview } from "./ProgressionPreview";
import type { ExerciseFormValues } from "~/models/exercises.server";

export type { ExerciseFormValues };

export type ExerciseFormErrors = Partial<
  Record<"title" | "keys" | "progression" | "tempo" | "dueDate" | "instructions" | "students", string>
>;

const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((k, i) => k === b[i]);

function initialChoice(keys: string[]) {
  if (same(keys, ALL_MAJOR_KEYS)) return "all-major";
  if (same(keys, ALL_MINOR_KEYS)) return "all-minor";
  return "listed";
}

/** The teacher's exercise form (new and edit), with the progression expanded live in each key. */
export function ExerciseForm({
  values,
  errors,
  students,
  submitLabel,
}: {
  values: ExerciseFormValues;
  errors: ExerciseFormErrors;
  students: Array<{ id: string; name: string }>;
  submitLabel: string;
}) {
  const id = useId();
  const navigation = useNavigation();
  const [choice, setChoice] = useState(initialChoice(values.keys));
  const [keysText, setKeysText] = useState(choice === "listed" ? values.keys.join(" ") : "");
  const [progression, setProgression] = useState(values.progression);
  const [assignedTo, setAssignedTo] = useState(values.assignedTo);
  const keys = choice === "all-major" ? ALL_MAJOR_KEYS : choice === "all-minor" ? ALL_MINOR_KEYS : splitKeys(keysText);

  return (
    <Form method="post" className="flex flex-col gap-5">
      <Field label="Title" name="title" defaultValue={values.title} error={errors.title} required maxLength={120} />

      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-semibold">Keys</legend>
        <div className="flex flex-wrap gap-4 text-sm">
          {[
            ["listed", "Keys I name"],
            ["all-major", "All twelve major keys"],
            ["all-minor", "All twelve minor keys"],
          ].map(([value, label]) => (
            <label key={value} className="flex items-center gap-1.5">
              <input
                type="radio"
                name="keyChoice"
                value={value}
                checked={choice === value}
                onChange={() => setChoice(value)}
              />
              {label}
            </label>
          ))}
        </div>
        {choice === "listed" ? (
          <Field
            label="Key or keys"
            name="keys"
            value={keysText}
            onChange={(e) => setKeysText(e.target.value)}
            error={errors.keys}
            hint="One or several, separated by spaces or commas: D, Ab, F# (major) or Gm, C#m (minor)."
            placeholder="D"
          />
        ) : errors.keys ? (
          <p className="text-sm text-brick" role="alert">
            {errors.keys}
          </p>
        ) : null}
      </fieldset>

      <div className="grid gap-4 lg:grid-cols-2">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-prog`} className="text-sm font-semibold">
            Target progression
          </label>
          <textarea
            id={`${id}-prog`}
            name="progression"
            rows={2}
            value={progression}
            onChange={(e) => setProgression(e.target.value)}
            aria-invalid={errors.progression ? true : undefined}
            aria-describedby={`${id}-prog-hint`}
            className={`rounded-md border bg-white px-3 py-2 font-mono text-base shadow-inner outline-none focus:border-tide ${errors.progression ? "border-brick" : "border-line"}`}
          />
          <p id={`${id}-prog-hint`} className="text-xs text-ink-soft">
            Roman numerals (I IV V I, vi IV I V, iiø7 V7 i, bVII) or chord symbols in the first key (Eb Bb/D Cm Cm/Bb
            Ab). Chord symbols are moved to the other keys.
          </p>
          {errors.progression ? (
            <p className="text-sm text-brick" role="alert">
              {errors.progression}
            </p>
          ) : null}
        </div>
        <div className="rounded-md border border-line bg-paper p-3">
          <p className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-soft">
            What Nearnote will listen for
          </p>
          <ProgressionPreview progression={progression} keys={keys} />
        </div>
      </div>

      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-semibold">Focus techniques</legend>
        <div className="grid gap-2 sm:grid-cols-2">
          {TECHNIQUES.map((t) => (
            <label key={t} className="flex items-start gap-2 text-sm">
              <input
                type="checkbox"
                name="focusTechniques"
                value={t}
                defaultChecked={values.focusTechniques.includes(t)}
                className="mt-1"
              />
              <span>
                <span className="font-semibold">{TECHNIQUE_WORDS[t].label}</span>
                <span className="block text-ink-soft">{TECHNIQUE_WORDS[t].text}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Tempo (beats per minute)"
          name="tempo"
          type="number"
          min={20}
          max={300}
          defaultValue={values.tempo ?? ""}
          error={errors.tempo}
        />
        <Field label="Due date" name="dueDate" type="date" defaultValue={values.dueDate ?? ""} error={errors.dueDate} />
      </div>

      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-ins`} className="text-sm font-semibold">
          Instructions
        </label>
        <textarea
          id={`${id}-ins`}
          name="instructions"
          rows={4}
          defaultValue={values.instructions}
          className="rounded-md border border-line bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-tide"
        />
        {errors.instructions ? (
          <p className="text-sm text-brick" role="alert">
            {errors.instructions}
          </p>
        ) : null}
      </div>

      <fieldset className="flex flex-col gap-2">
        <legend className="text-sm font-semibold">Set for</legend>
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-1.5">
            <input
              type="radio"
              name="assignedTo"
              value="studio"
              checked={assignedTo === "studio"}
              onChange={() => setAssignedTo("studio")}
            />
            The whole studio
          </label>
          <label className="flex items-center gap-1.5">
            <input
              type="radio"
              name="assignedTo"
              value="students"
              checked={assignedTo === "students"}
              onChange={() => setAssignedTo("students")}
            />
            Chosen students
          </label>
        </div>
        {assignedTo === "students" ? (
          <div className="grid gap-1 sm:grid-cols-3">
            {students.map((s) => (
              <label key={s.id} className="flex items-center gap-2 text-sm">
                <input type="checkbox" name="students" value={s.id} defaultChecked={values.students.includes(s.id)} />
                {s.name}
              </label>
            ))}
          </div>
        ) : null}
        {errors.students ? (
          <p className="text-sm text-brick" role="alert">
            {errors.students}
          </p>
        ) : null}
      </fieldset>

      <div>
        <Button pending={navigation.state === "submitting"} pendingLabel="Saving…">
          {submitLabel}
        </Button>
      </div>
    </Form>
  );
}
