import { and, eq, inArray, sql } from "drizzle-orm";
import { createContext, data, redirect, type MiddlewareFunction, type RouterContextProvider } from "react-router";
import { db, preparedQuery } from "~/db/client.server";
import { exerciseAssignees, exercises, memberships, takes, type Exercise, type Take } from "~/db/schema";
import { env } from "~/server/env.server";
import type { Refusal, Viewer } from "./refusal";
import { getSessionUser, type SessionUser, type StudioRole } from "./session.server";

/**
 * Every access rule of Nearnote lives here. Pages get a redirect to /login or a
 * 403 page; API routes (mode "api") get 401 / 403 JSON. The layouts in
 * app/routes.ts enforce who may enter a group of routes (the `*Middleware`
 * below); every loader and action still calls one of the `require*` helpers at
 * the top, which reads the person from the router context and adds the rule
 * for the one thing asked for (this take, this student…).
 */
export type AccessMode = "page" | "api";

/** What the helpers need from a loader's or action's arguments. */
export type RequestArgs = { request: Request; context: Readonly<RouterContextProvider>; url?: URL };

/** The signed-in person of this request (null: signed out), once it has been read. */
const sessionUserContext = createContext<{ user: SessionUser | null } | null>(null);

/**
 * The signed-in person, read from the session once per request: the root
 * middleware loads it, every later call reads the router context. A handler
 * run outside the router (a script) loads it here on first use.
 */
export async function currentUser({ request, context }: RequestArgs): Promise<SessionUser | null> {
  const loaded = context.get(sessionUserContext);
  if (loaded) return loaded.user;
  const user = await getSessionUser(request);
  context.set(sessionUserContext, { user });
  return user;
}

/**
 * After an action changed the signed-in person (name, address, memberships), the
 * loaders that run in the same request read them afresh.
 */
export function forgetCurrentUser(context: Readonly<RouterContextProvider>) {
  context.set(sessionUserContext, null);
}

/** Root middleware: reads the session once, before any loader or action. */
export const sessionMiddleware: MiddlewareFunction<Response> = async (args, next) => {
  await currentUser(args);
  return next();
};

export function deny(mode: AccessMode, message = "This page belongs to someone else."): never {
  if (mode === "api") throw Response.json({ error: message }, { status: 403 });
  throw data(message, { status: 403 });
}

export function notFound(mode: AccessMode, message = "Not found"): never {
  if (mode === "api") throw Response.json({ error: message }, { status: 404 });
  throw data(message, { status: 404 });
}

/** What the navigation shows of a signed-in person. */
export function viewerOf(user: SessionUser): Viewer {
  return { name: user.name, role: user.active?.role ?? null, studioName: user.active?.studioName ?? null };
}

export async function requireUser(args: RequestArgs, mode: AccessMode = "page"): Promise<SessionUser> {
  const user = await currentUser(args);
  if (!user) {
    if (mode === "api") throw Response.json({ error: "Sign in first." }, { status: 401 });
    // `url` is the page's address (a client-side navigation's request is for `<page>.data`).
    const url = args.url ?? new URL(args.request.url);
    throw redirect(`/login?redirectTo=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return user;
}

/** Signed-in pages like /login send people who already have a session on to /home. */
export async function requireAnonymous(args: RequestArgs) {
  if (await currentUser(args)) throw redirect("/home");
}

export type TeacherContext = SessionUser & { active: StudioRole & { role: "owner" | "teacher" } };
export type StudentContext = SessionUser & { active: StudioRole & { role: "student" } };

export function isTeacherRole(role: string | undefined | null) {
  return role === "owner" || role === "teacher";
}

const isTeacher = (user: SessionUser): user is TeacherContext => isTeacherRole(user.active?.role);
const isStudent = (user: SessionUser): user is StudentContext => user.active?.role === "student";
const TEACHERS_ONLY = "Only the studio's teachers can open this.";
const STUDENTS_ONLY = "This page is for students.";

/** A teacher (owner or co-teacher) working in their active studio. */
export async function requireTeacher(args: RequestArgs, mode: AccessMode = "page"): Promise<TeacherContext> {
  const user = await requireUser(args, mode);
  if (!isTeacher(user)) deny(mode, TEACHERS_ONLY);
  return user;
}

/** The owner of the active studio (for inviting co-teachers). */
export async function requireOwner(args: RequestArgs, mode: AccessMode = "page"): Promise<TeacherContext> {
  const user = await requireTeacher(args, mode);
  if (user.active.role !== "owner") deny(mode, "Only the studio's owner can do this.");
  return user;
}

/**
 * A co-teacher of the owner's active studio, for removing them: only the owner may, and
 * only a co-teacher (so nobody can remove the owner).
 */
export async function requireCoTeacherOfOwner(
  args: RequestArgs,
  teacherId: string | undefined,
  mode: AccessMode = "page",
) {
  const user = await requireOwner(args, mode);
  const row = teacherId
    ? db()
        .select()
        .from(memberships)
        .where(
          and(
            eq(memberships.userId, teacherId),
            eq(memberships.studioId, user.active.studioId),
            eq(memberships.role, "teacher"),
          ),
        )
        .get()
    : undefined;
  if (!row) deny(mode, "Only a co-teacher of your studio can be removed.");
  return { user, membership: row };
}

export async function requireStudent(args: RequestArgs, mode: AccessMode = "page"): Promise<StudentContext> {
  const user = await requireUser(args, mode);
  if (!isStudent(user)) deny(mode, STUDENTS_ONLY);
  return user;
}

/** Studios where this person teaches right now. */
export function teacherStudioIds(user: SessionUser): string[] {
  return user.studios.filter((s) => isTeacherRole(s.role)).map((s) => s.studioId);
}

/** Rule for one take: the student who played it, or a teacher of its studio. */
export function canSeeTake(user: SessionUser, take: Pick<Take, "studentId" | "studioId">): boolean {
  return take.studentId === user.id || teacherStudioIds(user).includes(take.studioId);
}

const takeQuery = preparedQuery((database) =>
  database
    .select()
    .from(takes)
    .where(eq(takes.id, sql.placeholder("takeId")))
    .prepare(),
);

export async function requireTakeAccess(
  args: RequestArgs,
  takeId: string | undefined,
  mode: AccessMode = "page",
): Promise<{ user: SessionUser; take: Take }> {
  const user = await requireUser(args, mode);
  const take = takeId ? takeQuery().get({ takeId }) : undefined;
  if (!take) notFound(mode, "There is no such take.");
  if (!canSeeTake(user, take)) deny(mode, "This take belongs to someone else.");
  return { user, take };
}

/**
 * Changing a take (moving, replacing, replying on it) needs an active membership in
 * the take's own studio: a removed student still reads their takes but changes none.
 */
export function requireActiveInStudio(user: SessionUser, studioId: string, mode: AccessMode = "page") {
  if (!user.studios.some((s) => s.studioId === studioId)) {
    deny(mode, "You are no longer a member of this take's studio, so it cannot be changed.");
  }
}

/** A teacher of the take's studio: comments on it, marks flags intended, reviews it. */
export function isTeacherOfTake(user: SessionUser, take: Pick<Take, "studioId">): boolean {
  return teacherStudioIds(user).includes(take.studioId);
}

/** Rule for one exercise: anyone active in its studio (students read, teachers edit: see `requireExerciseEdit`). */
export function canSeeExercise(user: SessionUser, exercise: Pick<Exercise, "studioId">): boolean {
  return user.studios.some((s) => s.studioId === exercise.studioId);
}

export function isExerciseSetFor(exercise: Pick<Exercise, "id" | "assignedTo">, userId: string): boolean {
  if (exercise.assignedTo === "studio") return true;
  return !!db()
    .select({ id: exerciseAssignees.userId })
    .from(exerciseAssignees)
    .where(and(eq(exerciseAssignees.exerciseId, exercise.id), eq(exerciseAssignees.userId, userId)))
    .get();
}

export async function requireExerciseAccess(
  args: RequestArgs,
  exerciseId: string | undefined,
  mode: AccessMode = "page",
): Promise<{ user: SessionUser; exercise: Exercise; asTeacher: boolean }> {
  const user = await requireUser(args, mode);
  const exercise = exerciseId ? db().select().from(exercises).where(eq(exercises.id, exerciseId)).get() : undefined;
  if (!exercise) notFound(mode, "There is no such exercise.");
  if (!canSeeExercise(user, exercise)) deny(mode, "This exercise belongs to another studio.");
  const asTeacher = teacherStudioIds(user).includes(exercise.studioId);
  // A student sees an exercise set for the whole studio, or one they are named on.
  if (!asTeacher && !isExerciseSetFor(exercise, user.id)) deny(mode, "This exercise is set for other students.");
  return { user, exercise, asTeacher };
}

export async function requireExerciseEdit(
  args: RequestArgs,
  exerciseId: string | undefined,
  mode: AccessMode = "page",
) {
  const result = await requireExerciseAccess(args, exerciseId, mode);
  if (!result.asTeacher) deny(mode, "Only the studio's teachers can change exercises.");
  return result;
}

/** A student of one of this teacher's studios (active or removed: removed students' takes stay reviewable). */
export async function requireStudentOfTeacher(
  args: RequestArgs,
  studentId: string | undefined,
  mode: AccessMode = "page",
) {
  const user = await requireTeacher(args, mode);
  const row = studentId
    ? db()
        .select()
        .from(memberships)
        .where(
          and(
            eq(memberships.userId, studentId),
            eq(memberships.role, "student"),
            inArray(memberships.studioId, [user.active.studioId]),
          ),
        )
        .get()
    : undefined;
  if (!row) deny(mode, "This student is not in your studio.");
  return { user, membership: row };
}

/**
 * Students named in a progress query (board chart, CSV export): each must be a
 * student of the teacher's active studio (removed ones too, like the rule above).
 */
export async function requireStudentsOfTeacher(args: RequestArgs, studentIds: string[], mode: AccessMode = "page") {
  const user = await requireTeacher(args, mode);
  const wanted = [...new Set(studentIds)];
  if (wanted.length) {
    const found = db()
      .select({ id: memberships.userId })
      .from(memberships)
      .where(
        and(
          eq(memberships.studioId, user.active.studioId),
          eq(memberships.role, "student"),
          inArray(memberships.userId, wanted),
        ),
      )
      .all();
    if (found.length !== wanted.length) deny(mode, "These students are not all in your studio.");
  }
  return user;
}

/**
 * React Router checks the origin of form posts to pages only. Resource and API
 * routes that change data call this: a browser's cross-site request carries
 * `Sec-Fetch-Site: cross-site` or a foreign `Origin`, and is refused with 403.
 */
export function requireSameOrigin(request: Request) {
  const site = request.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") {
    throw Response.json({ error: "Cross-site requests are refused." }, { status: 403 });
  }
  const origin = request.headers.get("origin");
  // Behind a proxy the request URL may be internal; the public APP_URL counts as ours too.
  if (origin && origin !== new URL(request.url).origin && origin !== new URL(env().appUrl).origin) {
    throw Response.json({ error: "Cross-origin requests are refused." }, { status: 403 });
  }
}

/**
 * Middleware for an API layout in app/routes.ts: everyone inside must meet `rule`
 * (401 / 403 JSON otherwise).
 */
function apiEntryRule(rule: (args: RequestArgs) => Promise<unknown>): MiddlewareFunction<Response> {
  return async (args, next) => {
    await rule(args);
    return next();
  };
}

/**
 * Middleware for a page layout in app/routes.ts: signed-out visitors go to /login, signed-in
 * people it does not `admit` get a 403 page. The refusal comes before any loader runs (so no
 * page data is read, not even for a `.data` request), the root loader included: it carries the
 * person (`Refusal`), so the root's navigation still shows them as signed in.
 */
function pageEntryRule(admit: (user: SessionUser) => boolean, message: string): MiddlewareFunction<Response> {
  return async (args, next) => {
    const user = await requireUser(args);
    if (!admit(user)) throw data({ message, viewer: viewerOf(user) } satisfies Refusal, { status: 403 });
    return next();
  };
}

export const visitorsOnly: MiddlewareFunction<Response> = async (args, next) => {
  await requireAnonymous(args);
  return next();
};
export const signedInOnly = pageEntryRule(() => true, "");
export const teachersOnly = pageEntryRule(isTeacher, TEACHERS_ONLY);
export const studentsOnly = pageEntryRule(isStudent, STUDENTS_ONLY);
export const signedInApi = apiEntryRule((args) => requireUser(args, "api"));
export const teachersApi = apiEntryRule((args) => requireTeacher(args, "api"));
