import { and, desc, eq, inArray, isNotNull, isNull, or, sql } from "drizzle-orm";
import { z } from "zod";
import { TECHNIQUES } from "~/analysis/types";
import { db, preparedQuery } from "~/db/client.server";
import { exerciseAssignees, exercises, takeMetrics, takes, users, type Exercise } from "~/db/schema";
import { ALL_MAJOR_KEYS, ALL_MINOR_KEYS, checkProgression, splitKeys } from "~/utils/exerciseProgression";
import { byState, exerciseState, type ExerciseState } from "~/utils/exerciseState";
import { pretty } from "~/utils/noteText";
import { studioStudents, studioTimeZone } from "./progress.server";
import { todayIn } from "./progressQuery.server";

// Exercises as the teacher sets them: validation of the form, saving, archiving, and what
// each side sees (the teacher every exercise with figures of the takes sent, a student theirs by key).

export const exerciseFormSchema = z.object({
  title: z.string().trim().min(1, "Give the exercise a title.").max(120, "Keep the title under 120 characters."),
  keyChoice: z.enum(["listed", "all-major", "all-minor"]).default("listed"),
  keys: z.string().trim().max(200).default(""),
  progression: z.string().trim().min(1, "Write the target progression, e.g. I IV V I or D G A D.").max(600),
  focusTechniques: z.array(z.enum(TECHNIQUES as [string, ...string[]])).default([]),
  tempo: z
    .string()
    .trim()
    .transform((v) => (v === "" ? null : Number(v)))
    .pipe(
      z
        .number()
        .int("Tempo is a whole number of beats per minute.")
        .min(20, "Tempo is 20–300 bpm.")
        .max(300, "Tempo is 20–300 bpm.")
        .nullable(),
    )
    .default(null),
  dueDate: z
    .string()
    .trim()
    .transform((v) => v || null)
    .pipe(
      z
        .string()
        .regex(/^\d{4}-\d{2}-\d{2}$/, "Pick a date.")
        .nullable(),
    )
    .default(null),
  instructions: z.string().trim().max(4000, "Keep the instructions under 4,000 characters.").default(""),
  assignedTo: z.enum(["studio", "students"]).default("studio"),
  students: z.array(z.string().max(64)).default([]),
});

/** What the exercise form edits: the same shape the form component shows. */
export type ExerciseInput = ExerciseFormValues;

/** The fields of an exercise that its pages show and its form edits. */
export function exerciseFields(e: Exercise) {
  return {
    id: e.id,
    title: e.title,
    keys: e.keys,
    progression: e.progression,
    focusTechniques: e.focusTechniques,
    tempo: e.tempo,
    dueDate: e.dueDate,
    instructions: e.instructions,
    assignedTo: e.assignedTo,
  };
}

export type FieldErrors = Partial<
  Record<"title" | "keys" | "progression" | "tempo" | "dueDate" | "instructions" | "students", string>
>;

/** Reads the exercise form; returns the input or one message per field at fault. */
export function readExerciseForm(
  form: FormData,
  studioStudentIds: readonly string[],
): { ok: true; input: ExerciseInput } | { ok: false; errors: FieldErrors } {
  const raw = {
    ...Object.fromEntries([...form.entries()].filter(([k]) => k !== "focusTechniques" && k !== "students")),
    focusTechniques: form.getAll("focusTechniques").map(String),
    students: form.getAll("students").map(String),
  };
  const parsed = exerciseFormSchema.safeParse(raw);
  if (!parsed.success) {
    const errors: FieldErrors = {};
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0]) as keyof FieldErrors;
      errors[field] ??= issue.message;
    }
    return { ok: false, errors };
  }
  const d = parsed.data;
  const keys =
    d.keyChoice === "all-major" ? ALL_MAJOR_KEYS : d.keyChoice === "all-minor" ? ALL_MINOR_KEYS : splitKeys(d.keys);
  const check = checkProgression(d.progression, keys);
  if (!check.ok) return { ok: false, errors: { [check.field]: check.message } };
  const students = [...new Set(d.students)];
  if (d.assignedTo === "students") {
    if (students.length === 0)
      return { ok: false, errors: { students: "Choose at least one student, or set it for the whole studio." } };
    if (students.some((s) => !studioStudentIds.includes(s)))
      return { ok: false, errors: { students: "Choose students of this studio." } };
  }
  return {
    ok: true,
    input: { ...d, keys, students: d.assignedTo === "students" ? students : [] },
  };
}

export function createExercise(studioId: string, teacherId: string, input: ExerciseInput): string {
  const { students, ...fields } = input;
  return db().transaction((tx) => {
    const row = tx
      .insert(exercises)
      .values({ ...fields, studioId, createdById: teacherId })
      .returning({ id: exercises.id })
      .get();
    if (students.length)
      tx.insert(exerciseAssignees)
        .values(students.map((userId) => ({ exerciseId: row.id, userId })))
        .run();
    return row.id;
  });
}

export function updateExercise(exerciseId: string, input: ExerciseInput) {
  const { students, ...fields } = input;
  db().transaction((tx) => {
    tx.update(exercises).set(fields).where(eq(exercises.id, exerciseId)).run();
    tx.delete(exerciseAssignees).where(eq(exerciseAssignees.exerciseId, exerciseId)).run();
    if (students.length)
      tx.insert(exerciseAssignees)
        .values(students.map((userId) => ({ exerciseId, userId })))
        .run();
  });
}

export function setArchived(exerciseId: string, archived: boolean) {
  db()
    .update(exercises)
    .set({ archivedAt: archived ? new Date() : null })
    .where(eq(exercises.id, exerciseId))
    .run();
}

export function assigneeIds(exerciseId: string): string[] {
  return db()
    .select({ id: exerciseAssignees.userId })
    .from(exerciseAssignees)
    .where(eq(exerciseAssignees.exerciseId, exerciseId))
    .all()
    .map((r) => r.id);
}

/** The students an exercise is set for: every active student of the studio, or the chosen ones. */
export function studentsOfExercise(exercise: Pick<Exercise, "id" | "studioId" | "assignedTo">) {
  const all = studioStudents(exercise.studioId);
  if (exercise.assignedTo === "studio") return all;
  const chosen = new Set(assigneeIds(exercise.id));
  return all.filter((s) => chosen.has(s.id));
}

export type ExerciseTakeRow = {
  id: string;
  studentId: string;
  studentName: string;
  key: string | null;
  recordedAt: string;
  status: string;
  score: number | null;
  accuracy: number | null;
};

/** Takes sent for one exercise, newest first; only one student's when `studentId` is given. */
export function takesOfExercise(exerciseId: string, studentId?: string): ExerciseTakeRow[] {
  return db()
    .select({
      id: takes.id,
      studentId: takes.studentId,
      studentName: users.name,
      key: takes.key,
      recordedAt: takes.recordedAt,
      status: takes.status,
      score: takeMetrics.score,
      accuracy: takeMetrics.accuracy,
    })
    .from(takes)
    .innerJoin(users, eq(users.id, takes.studentId))
    .leftJoin(takeMetrics, eq(takeMetrics.takeId, takes.id))
    .where(and(eq(takes.exerciseId, exerciseId), studentId ? eq(takes.studentId, studentId) : undefined))
    .orderBy(desc(takes.recordedAt))
    .all()
    .map((r) => ({ ...r, recordedAt: r.recordedAt.toISOString() }));
}

export type KeyProgress = { key: string; takes: ExerciseTakeRow[]; best: number | null; bestAccuracy: number | null };

/** Per key: the takes and the best score so far. A key with an analysed take counts as sent. */
export function progressByKey(keys: readonly string[], rows: readonly ExerciseTakeRow[]): KeyProgress[] {
  return keys.map((key) => {
    const mine = rows.filter((r) => r.key === key);
    const scores = mine.map((r) => r.score).filter((s): s is number => s !== null);
    const acc = mine.map((r) => r.accuracy).filter((s): s is number => s !== null);
    return {
      key,
      takes: mine,
      best: scores.length ? Math.max(...scores) : null,
      bestAccuracy: acc.length ? Math.max(...acc) : null,
    };
  });
}

/** Done: every key has an analysed take (the same rule as exerciseState). */
export function isDone(progress: readonly KeyProgress[]): boolean {
  return exerciseState({ dueDate: null }, progress, "").kind === "done";
}

export type StudentExercise = ExerciseOption & { progress: KeyProgress[]; state: ExerciseState };

/**
 * A student's open exercises with their takes by key and their state (done, overdue, due, to
 * do), in the order a student works through them. Every student page that lists exercises
 * reads them here, so they agree.
 */
export function studentExercises(studentId: string, studioId: string): { today: string; exercises: StudentExercise[] } {
  const today = todayIn(studioTimeZone(studioId));
  const list = listExercisesForStudent(studentId, studioId).map((e) => {
    const progress = progressByKey(e.keys, takesOfExercise(e.id, studentId));
    return { ...e, progress, state: exerciseState(e, progress, today, pretty) };
  });
  return { today, exercises: byState(list) };
}

/** One exercise's state for a student (the exercise page), by the same rule. */
export function studentExerciseState(
  exercise: Pick<Exercise, "id" | "keys" | "dueDate" | "studioId">,
  studentId: string,
): ExerciseState {
  const progress = progressByKey(exercise.keys, takesOfExercise(exercise.id, studentId));
  return exerciseState(exercise, progress, todayIn(studioTimeZone(exercise.studioId)), pretty);
}

/** Every exercise of the studio for its teachers, archived ones last, with counts of students who sent a take. */
export function listExercisesForTeacher(studioId: string) {
  const rows = db().select().from(exercises).where(eq(exercises.studioId, studioId)).orderBy(exercises.dueDate).all();
  const ids = rows.map((r) => r.id);
  const handedIn = ids.length
    ? db()
        .selectDistinct({ exerciseId: takes.exerciseId, studentId: takes.studentId })
        .from(takes)
        .where(and(inArray(takes.exerciseId, ids), isNotNull(takes.exerciseId)))
        .all()
    : [];
  return rows
    .map((e) => ({
      id: e.id,
      title: e.title,
      keys: e.keys,
      progression: e.progression,
      dueDate: e.dueDate,
      archived: e.archivedAt !== null,
      assignedTo: e.assignedTo,
      setFor: studentsOfExercise(e).length,
      handedIn: handedIn.filter((h) => h.exerciseId === e.id).length,
    }))
    .sort((a, b) => Number(a.archived) - Number(b.archived));
}

export type ExerciseOption = {
  id: string;
  title: string;
  keys: string[];
  dueDate: string | null;
  progression: string;
  tempo: number | null;
  focusTechniques: string[];
};

/** Exercises of the studio that are set for the whole studio or for this student, not archived. */
const studentExercisesQuery = preparedQuery((database) => {
  const assigned = database
    .select({ id: exerciseAssignees.exerciseId })
    .from(exerciseAssignees)
    .where(eq(exerciseAssignees.userId, sql.placeholder("studentId")));
  return database
    .select({
      id: exercises.id,
      title: exercises.title,
      keys: exercises.keys,
      dueDate: exercises.dueDate,
      progression: exercises.progression,
      tempo: exercises.tempo,
      focusTechniques: exercises.focusTechniques,
    })
    .from(exercises)
    .where(
      and(
        eq(exercises.studioId, sql.placeholder("studioId")),
        isNull(exercises.archivedAt),
        or(eq(exercises.assignedTo, "studio"), inArray(exercises.id, assigned)),
      ),
    )
    .orderBy(exercises.dueDate)
    .prepare();
});

export function listExercisesForStudent(studentId: string, studioId: string): ExerciseOption[] {
  return studentExercisesQuery().all({ studentId, studioId });
}

export function exerciseForStudent(studentId: string, studioId: string, exerciseId: string) {
  return listExercisesForStudent(studentId, studioId).find((e) => e.id === exerciseId) ?? null;
}

/** What the exercise form edits (the form component takes this type from here). */
export type ExerciseFormValues = {
  title: string;
  keys: string[];
  progression: string;
  focusTechniques: string[];
  tempo: number | null;
  dueDate: string | null;
  instructions: string;
  assignedTo: "studio" | "students";
  students: string[];
};
