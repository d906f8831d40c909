import type { Route } from "./+types/exercises.$exerciseId.edit";
import { requireExerciseEdit } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { ExerciseForm } from "~/components/exercises/ExerciseForm";
import { formFailure, readForm, redirectWithFlash } from "~/forms/forms.server";
import { PageHeader } from "~/components/PageHeader";
import {
  assigneeIds,
  exerciseFields,
  readExerciseForm,
  takesOfExercise,
  updateExercise,
} from "~/models/exercises.server";
import { studioStudents } from "~/models/progress.server";
import { reanalyseTake } from "~/models/takes.server";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: data ? `Edit ${data.exercise.title} · Nearnote` : "Edit exercise · Nearnote" },
];

export async function loader({ request, params, context }: Route.LoaderArgs) {
  const { exercise } = await requireExerciseEdit({ request, context }, params.exerciseId);
  return {
    exercise: { ...exerciseFields(exercise), students: assigneeIds(exercise.id) },
    students: studioStudents(exercise.studioId).map((s) => ({ id: s.id, name: s.name })),
  };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const { exercise } = await requireExerciseEdit({ request, context }, params.exerciseId);
  const students = studioStudents(exercise.studioId).map((s) => s.id);
  const form = await readForm(request);
  const read = readExerciseForm(form, students);
  if (!read.ok) return formFailure({ form, fieldErrors: read.errors });
  updateExercise(exercise.id, read.input);
  // A new target changes what the takes handed in are graded against: grade them again.
  const targetChanged =
    read.input.progression !== exercise.progression || read.input.keys.join(" ") !== exercise.keys.join(" ");
  const regraded = targetChanged ? takesOfExercise(exercise.id) : [];
  for (const t of regraded) await reanalyseTake(t.id);
  const message = regraded.length
    ? `Exercise saved; ${regraded.length} take${regraded.length === 1 ? "" : "s"} graded against the new target.`
    : "Exercise saved.";
  return redirectWithFlash(`/exercises/${exercise.id}`, message, request);
}

export default function EditExercise({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title={`Edit “${loaderData.exercise.title}”`} />
      <Card>
        <ExerciseForm
          values={loaderData.exercise}
          errors={actionData?.fieldErrors ?? {}}
          students={loaderData.students}
          submitLabel="Save exercise"
        />
      </Card>
    </div>
  );
}
