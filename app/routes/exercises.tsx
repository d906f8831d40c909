import { Link } from "react-router";
import type { Route } from "./+types/exercises";
import { isTeacherRole, requireUser } from "~/auth/access.server";
import { ButtonLink } from "~/components/Button";
import { Card } from "~/components/Card";
import { EmptyState } from "~/components/EmptyState";
import { StudentExerciseCard } from "~/components/exercises/StudentExerciseCard";
import { PageHeader } from "~/components/PageHeader";
import { dayLabel, pretty } from "~/utils/noteText";
import { listExercisesForTeacher, studentExercises } from "~/models/exercises.server";

export const meta: Route.MetaFunction = () => [{ title: "Exercises · Nearnote" }];

export async function loader({ request, context }: Route.LoaderArgs) {
  const user = await requireUser({ request, context });
  const active = user.active;
  if (!active) return { role: "none" as const, teacher: null, student: null };
  if (isTeacherRole(active.role))
    return { role: "teacher" as const, teacher: listExercisesForTeacher(active.studioId), student: null };
  const set = studentExercises(user.id, active.studioId).exercises;
  return {
    role: "student" as const,
    teacher: null,
    student: { due: set.filter((e) => e.state.kind !== "done"), done: set.filter((e) => e.state.kind === "done") },
  };
}

export default function Exercises({ loaderData }: Route.ComponentProps) {
  const { teacher, student } = loaderData;
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Exercises"
        lead={
          teacher
            ? "What you have set, who it is for and how many have sent a take."
            : "What your teacher has set, key by key."
        }
        actions={teacher ? <ButtonLink to="/exercises/new">New exercise</ButtonLink> : null}
      />
      {teacher ? (
        teacher.length === 0 ? (
          <EmptyState title="No exercises yet" action={<ButtonLink to="/exercises/new">Set the first one</ButtonLink>}>
            An exercise names the chords to play, the keys and what to listen for; students' takes are graded against
            it.
          </EmptyState>
        ) : (
          <Card>
            <table className="w-full text-sm">
              <thead>
                <tr className="border-b border-line text-left text-ink-soft">
                  <th scope="col" className="py-2 pr-4">
                    Exercise
                  </th>
                  <th scope="col" className="hidden py-2 pr-4 sm:table-cell">
                    Keys
                  </th>
                  <th scope="col" className="py-2 pr-4">
                    Due
                  </th>
                  <th scope="col" className="py-2 pr-4">
                    Takes sent
                  </th>
                  <th scope="col" className="hidden py-2 sm:table-cell">
                    State
                  </th>
                </tr>
              </thead>
              <tbody>
                {teacher.map((e) => (
                  <tr key={e.id} className={`border-b border-line/60 ${e.archived ? "text-ink-soft" : ""}`}>
                    <td className="py-2 pr-4">
                      <Link to={`/exercises/${e.id}`} className="font-semibold text-tide-dark hover:underline">
                        {e.title}
                      </Link>
                      <div className="break-words font-mono text-xs text-ink-soft">{pretty(e.progression)}</div>
                    </td>
                    <td className="hidden py-2 pr-4 sm:table-cell">
                      {e.keys.length === 12 ? "all twelve" : e.keys.map(pretty).join(", ")}
                    </td>
                    <td className="whitespace-nowrap py-2 pr-4">
                      {e.dueDate ? dayLabel(`${e.dueDate}T12:00:00Z`) : "–"}
                    </td>
                    <td className="py-2 pr-4">
                      {e.handedIn} of {e.setFor}
                      {e.assignedTo === "students" ? (
                        <span className="ml-1 text-xs text-ink-soft">(chosen students)</span>
                      ) : null}
                    </td>
                    <td className="hidden py-2 sm:table-cell">{e.archived ? "archived" : "open"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </Card>
        )
      ) : student ? (
        <>
          <section aria-labelledby="due-heading" className="flex flex-col gap-3">
            <h2 id="due-heading" className="text-lg font-semibold">
              To do
            </h2>
            {student.due.length === 0 ? (
              <p className="text-sm text-ink-soft">Nothing due: every exercise has a take in each key.</p>
            ) : (
              student.due.map((e) => <StudentExerciseCard key={e.id} exercise={e} />)
            )}
          </section>
          <section aria-labelledby="done-heading" className="flex flex-col gap-3">
            <h2 id="done-heading" className="text-lg font-semibold">
              Done
            </h2>
            {student.done.length === 0 ? (
              <p className="text-sm text-ink-soft">Exercises with a take in every key appear here.</p>
            ) : (
              student.done.map((e) => <StudentExerciseCard key={e.id} exercise={e} />)
            )}
          </section>
        </>
      ) : (
        <EmptyState title="You are not in a studio yet">
          Join a studio through your teacher's invitation to see exercises.
        </EmptyState>
      )}
    </div>
  );
}
