import { data, redirect } from "react-router";
import type { Route } from "./+types/exercises.new";
import { requireTeacher } from "~/auth/access.server";
import { Card } from "~/components/Card";
import { ExerciseForm, type ExerciseFormErrors } from "~/components/exercises/ExerciseForm";
import { PageHeader } from "~/components/PageHeader";
import { flashHeader } from "~/lib/flash.server";
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
  const read = readExerciseForm(await request.formData(), students);
  if (!read.ok) return data({ errors: read.errors as ExerciseFormErrors }, { status: 400 });
  const id = createExercise(user.active.studioId, user.id, read.input);
  return redirect(`/exercises/${id}`, {
    headers: { "Set-Cookie": await flashHeader(request, { tone: "success", message: `Exercise "${read.input.title}" is set.` }) },
  });
}

export default function NewExercise({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="New exercise" lead="Set focused practice: the chords to play, in which keys, and what to listen for." />
      <Card>
        <ExerciseForm
          values={{ title: "", keys: [], progression: "", focusTechniques: [], tempo: null, dueDate: null, instructions: "", assignedTo: "studio", students: [] }}
          errors={actionData?.errors ?? {}}
          students={loaderData.students}
          submitLabel="Set exercise"
        />
      </Card>
    </div>
  );
}
