import type { Route } from "./+types/exercises.new";
import { requireTeacher } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { ExerciseForm } from "~/components/exercises/ExerciseForm";
import { formFailure, readForm, redirectWithFlash } from "~/forms/forms.server";
import { PageHeader } from "~/components/PageHeader";
import { createExercise, readExerciseForm } from "~/models/exercises.server";
import { studioStudents } from "~/models/progress.server";

export const meta: Route.MetaFunction = () => [{ title: "New exercise · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireTeacher({ request, context });
  return { students: studioStudents(user.active.studioId).map((s) => ({ id: s.id, name: s.name })) };
}

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireTeacher({ request, context });
  const students = studioStudents(user.active.studioId).map((s) => s.id);
  const form = await readForm(request);
  const read = readExerciseForm(form, students);
  if (!read.ok) return formFailure({ form, fieldErrors: read.errors });
  const id = createExercise(user.active.studioId, user.id, read.input);
  return redirectWithFlash(`/exercises/${id}`, `Exercise "${read.input.title}" is set.`, request);
}

export default function NewExercise({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="New exercise"
        lead="Set focused practice: the chords to play, in which keys, and what to listen for."
      />
      <Card>
        <ExerciseForm
          values={{
            title: "",
            keys: [],
            progression: "",
            focusTechniques: [],
            tempo: null,
            dueDate: null,
            instructions: "",
            assignedTo: "studio",
            students: [],
          }}
          errors={actionData?.fieldErrors ?? {}}
          students={loaderData.students}
          submitLabel="Set exercise"
        />
      </Card>
    </div>
  );
}
