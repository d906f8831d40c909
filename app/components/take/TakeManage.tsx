import { Form, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { ExerciseKeyFields, type ExerciseChoice } from "./ExerciseKeyFields";

const fileInputClass =
  "block w-full text-sm text-ink-soft file:mr-3 file:rounded-md file:border file:border-line file:bg-card file:px-3 file:py-2 file:font-semibold file:text-ink hover:file:border-tide";

/** The student's own actions on a take: move it, replace it with a new upload, delete it. */
export function TakeManage({
  exercises,
  exerciseId,
  takeKey,
  error,
}: {
  exercises: ExerciseChoice[];
  exerciseId: string | null;
  takeKey: string | null;
  error: { intent: string; message: string } | null;
}) {
  const navigation = useNavigation();
  const busy = (intent: string) =>
    navigation.state === "submitting" &&
    (navigation.formData?.get("intent") === intent || navigation.formAction?.includes(`intent=${intent}`));
  const errorFor = (intent: string) =>
    error?.intent === intent ? (
      <p role="alert" className="text-sm text-brick">
        {error.message}
      </p>
    ) : null;
  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <Form method="post" className="flex min-w-0 flex-col gap-3" aria-labelledby="move-heading">
        <h3 id="move-heading" className="font-semibold">
          Move to another exercise
        </h3>
        <p className="text-sm text-ink-soft">The take is graded again against the new exercise's chords.</p>
        <ExerciseKeyFields
          exercises={exercises}
          defaultExerciseId={exerciseId ?? ""}
          defaultKey={takeKey ?? ""}
          stacked
        />
        {errorFor("move")}
        <div>
          <Button name="intent" value="move" variant="secondary" pending={busy("move")} pendingLabel="Moving…">
            Move take
          </Button>
        </div>
      </Form>
      <Form
        method="post"
        action="?intent=replace"
        encType="multipart/form-data"
        className="flex min-w-0 flex-col gap-3"
        aria-labelledby="replace-heading"
      >
        <h3 id="replace-heading" className="font-semibold">
          Replace with a new recording
        </h3>
        <p className="text-sm text-ink-soft">
          Keeps this take's exercise, key and note; the old file is removed once the new one is saved.
        </p>
        <label className="flex flex-col gap-1 text-sm font-semibold">
          New MIDI file
          <input
            type="file"
            name="file"
            accept=".mid,.midi,audio/midi,audio/x-midi"
            required
            className={fileInputClass}
          />
        </label>
        {errorFor("replace")}
        <div>
          <Button variant="secondary" pending={busy("replace")} pendingLabel="Uploading…">
            Replace take
          </Button>
        </div>
      </Form>
      <Form method="post" className="flex flex-col gap-3" aria-labelledby="delete-heading">
        <h3 id="delete-heading" className="font-semibold">
          Delete this take
        </h3>
        <p className="text-sm text-ink-soft">
          The take, its analysis and its file are removed for good; your teacher will no longer see it.
        </p>
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" name="confirm" value="yes" required className="mt-1 accent-brick" />
          Yes, delete this take and its file
        </label>
        {errorFor("delete")}
        <div>
          <Button name="intent" value="delete" variant="danger" pending={busy("delete")} pendingLabel="Deleting…">
            Delete take
          </Button>
        </div>
      </Form>
    </div>
  );
}
