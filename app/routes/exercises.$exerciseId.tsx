import { Form, Link, useNavigation, useRevalidator } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/exercises.$exerciseId";
import { requireExerciseAccess, requireExerciseEdit } from "~/auth/access.server";
import { Button, ButtonLink, buttonClass } from "~/components/Button";
import { Card } from "~/components/Card";
import { FlashMessage } from "~/components/FlashMessage";
import { ExerciseFacts } from "~/components/exercises/ExerciseFacts";
import { ExerciseStateBadge } from "~/components/exercises/ExerciseStateBadge";
import { KeyProgressTable } from "~/components/exercises/KeyProgressTable";
import { ModelAnswer } from "~/components/exercises/ModelAnswer";
import { PageHeader } from "~/components/PageHeader";
import { PracticeCare } from "~/components/PracticeCare";
import { RecordPanel } from "~/components/record/RecordPanel";
import { checkProgression, targetChordsInKey } from "~/utils/exerciseProgression";
import { failureMessage } from "~/forms/failure";
import { formFailure, parseForm, readForm, redirectWithFlash } from "~/forms/forms.server";
import { fitsFirstChord } from "~/utils/modelAnswer";
import { pretty } from "~/utils/noteText";
import {
  exerciseFields,
  isDone,
  progressByKey,
  setArchived,
  studentExerciseState,
  studentsOfExercise,
  takesOfExercise,
} from "~/models/exercises.server";
import { modelTakeNotes, removeModelTake, storeModelTake } from "~/models/modelTakes.server";
import { db } from "~/db/client.server";
import { exercises } from "~/db/schema";
import { eq } from "drizzle-orm";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: data ? `${data.exercise.title} · Nearnote` : "Exercise · Nearnote" },
];

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { user, exercise, asTeacher } = await requireExerciseAccess({ request, context }, params.exerciseId);
  const check = checkProgression(exercise.progression, exercise.keys);
  const rows = takesOfExercise(exercise.id, asTeacher ? undefined : user.id);
  const students = asTeacher
    ? studentsOfExercise(exercise).map((s) => {
        const progress = progressByKey(
          exercise.keys,
          rows.filter((r) => r.studentId === s.id),
        );
        return { id: s.id, name: s.name, progress, done: isDone(progress) };
      })
    : [];
  const mine = asTeacher ? null : progressByKey(exercise.keys, rows);
  // The student's state of this exercise, decided as on home and the list of exercises.
  const state = asTeacher ? null : studentExerciseState(exercise, user.id);
  return {
    asTeacher,
    exercise: {
      ...exerciseFields(exercise),
      archived: exercise.archivedAt !== null,
      modelStart: exercise.modelStart ?? null,
    },
    expanded: check.ok ? check.keys : [],
    modelTake: await modelTakeNotes(exercise),
    students,
    mine,
    state,
  };
}

const actionSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.enum(["archive", "unarchive", "remove-model-take"]) }),
  z.object({
    intent: z.literal("model-start"),
    notes: z.string({ error: "Pick two to eight keys." }).regex(/^\d{1,3}(,\d{1,3}){1,7}$/, "Pick two to eight keys."),
  }),
]);

export async function action({ request, params, context }: Route.ActionArgs) {
  const { exercise } = await requireExerciseEdit({ request, context }, params.exerciseId);
  const done = (message: string) => redirectWithFlash(`/exercises/${exercise.id}`, message, request);
  // The model take arrives as multipart; the parser reads the body, so its intent is in the URL.
  if (new URL(request.url).searchParams.get("intent") === "model-take") {
    const error = await storeModelTake(request, exercise);
    if (error) return formFailure({ formError: error });
    return done("Model take attached.");
  }
  const form = await readForm(request);
  const parsed = parseForm(actionSchema, form);
  if (!parsed.ok) return parsed.response;
  const input = parsed.data;
  switch (input.intent) {
    case "archive":
    case "unarchive":
      setArchived(exercise.id, input.intent === "archive");
      return done(
        input.intent === "archive" ? "Exercise archived: students no longer see it as due." : "Exercise brought back.",
      );
    case "remove-model-take":
      await removeModelTake(exercise);
      return done("Model take removed.");
    case "model-start": {
      const notes = input.notes
        .split(",")
        .map(Number)
        .sort((a, b) => a - b);
      const first = targetChordsInKey(exercise.progression, exercise.keys, exercise.keys[0])[0];
      if (notes.some((n) => n < 21 || n > 108) || !fitsFirstChord(notes, first)) {
        return formFailure({
          form,
          fieldErrors: { notes: `The starting voicing must use exactly the tones of ${pretty(first.symbol)}.` },
        });
      }
      db().update(exercises).set({ modelStart: notes }).where(eq(exercises.id, exercise.id)).run();
      return done("Starting voicing saved; the model answer follows from it.");
    }
  }
}

export default function ExercisePage({ loaderData, actionData }: Route.ComponentProps) {
  const { exercise, asTeacher, expanded, students, mine, state, modelTake } = loaderData;
  const navigation = useNavigation();
  const revalidator = useRevalidator();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title={exercise.title}
        lead={`${exercise.keys.length === 12 ? "All twelve keys" : exercise.keys.map(pretty).join(", ")}${exercise.archived ? " · archived" : ""}`}
        actions={
          asTeacher ? (
            <>
              <ButtonLink to={`/exercises/${exercise.id}/edit`} variant="secondary">
                Edit
              </ButtonLink>
              <Form method="post">
                <input type="hidden" name="intent" value={exercise.archived ? "unarchive" : "archive"} />
                <Button variant="secondary">{exercise.archived ? "Bring back" : "Archive"}</Button>
              </Form>
            </>
          ) : null
        }
      />
      {state ? (
        <p className="flex flex-wrap items-center gap-2 text-sm" data-testid="my-exercise-state">
          <ExerciseStateBadge state={state} />
          <span>{state.detail}</span>
        </p>
      ) : null}
      {failureMessage(actionData) ? <FlashMessage tone="error">{failureMessage(actionData)}</FlashMessage> : null}
      <ExerciseFacts exercise={exercise} expanded={expanded} />

      <Card title="Model answer">
        <ModelAnswer
          progression={exercise.progression}
          keys={exercise.keys}
          start={exercise.modelStart}
          tempo={exercise.tempo}
          canEdit={asTeacher}
          focus={exercise.focusTechniques}
          modelTake={modelTake}
        />
        {asTeacher ? (
          <div className="mt-4 flex flex-wrap items-end gap-3 border-t border-line pt-4">
            <Form
              method="post"
              action="?intent=model-take"
              encType="multipart/form-data"
              className="flex flex-wrap items-end gap-2"
            >
              <label className="flex flex-col gap-1 text-sm">
                <span className="font-semibold">
                  {modelTake ? "Replace the model take" : "Attach a model take of your own"}
                </span>
                <input type="file" name="file" accept=".mid,.midi,audio/midi" required className="text-sm" />
              </label>
              <Button variant="secondary" pending={navigation.state === "submitting"}>
                Attach
              </Button>
            </Form>
            {modelTake ? (
              <Form method="post">
                <input type="hidden" name="intent" value="remove-model-take" />
                <Button variant="quiet">Remove model take</Button>
              </Form>
            ) : null}
          </div>
        ) : null}
      </Card>

      {asTeacher ? (
        <Card title="Takes sent">
          <KeyProgressTable keys={exercise.keys} rows={students} />
        </Card>
      ) : (
        <>
          <Card title="Your takes">
            <KeyProgressTable
              keys={exercise.keys}
              rows={[{ id: "me", name: "You", progress: mine ?? [], done: state?.kind === "done" }]}
            />
            {!exercise.archived ? (
              <div className="mt-4 flex flex-wrap gap-2">
                {exercise.keys.map((k) => (
                  <Link
                    key={k}
                    to={`/takes/new?exercise=${exercise.id}&key=${encodeURIComponent(k)}`}
                    className={buttonClass("primary")}
                  >
                    Upload or record in {pretty(k)}
                  </Link>
                ))}
              </div>
            ) : null}
          </Card>
          {/* Record straight from a MIDI keyboard, graded live; the table above refreshes after an upload. */}
          {!exercise.archived ? (
            <RecordPanel
              exerciseId={exercise.id}
              exerciseKeys={exercise.keys}
              tempo={exercise.tempo}
              uploadHref={`/takes/new?exercise=${exercise.id}`}
              onUploaded={() => void revalidator.revalidate()}
            />
          ) : null}
        </>
      )}
      <PracticeCare />
    </div>
  );
}
