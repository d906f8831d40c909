// Who gets what, for every route in app/routes.ts, asked through the app's real
// request handler (middleware included). The test walks the route config itself, so a new route without a line in EXPECTED fails here: add
// its expectations below (GET always, POST when the route has an action).
import path from "node:path";
import { beforeEach, describe, expect, it } from "vitest";
import routes from "~/routes";
import { createUserSession } from "~/auth/session.server";
import { hashToken } from "~/auth/tokens.server";
import { db } from "~/db/client.server";
import { invitations } from "~/db/schema";
import { resetEnvForTests } from "~/server/env.server";
import { storeMessage } from "~/mail/mailStore.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, join, makeExercise, makeStudio, makeTakeRow, makeUser, ORIGIN } from "./accountsKit";

const PERSONAS = ["anon", "studentA", "studentB", "teacher", "coTeacher", "otherTeacher"] as const;
type Persona = (typeof PERSONAS)[number];

/** An expected status; "login" means a 302 to /login?redirectTo=… (a signed-out visitor on a page). */
type Expect = number | "login";
type Row = Record<Persona, Expect>;

const row = (
  anon: Expect,
  studentA: Expect,
  studentB: Expect,
  teacher: Expect,
  coTeacher: Expect,
  otherTeacher: Expect,
): Row => ({
  anon,
  studentA,
  studentB,
  teacher,
  coTeacher,
  otherTeacher,
});
const everyone = (status: Expect) => row(status, status, status, status, status, status);
/** Any signed-in person; signed-out visitors go to /login. */
const signedIn = (status = 200) => row("login", status, status, status, status, status);
/** Teachers of any studio (each sees their own); students get 403. */
const teachers = (status = 200) => row("login", 403, 403, status, status, status);
/** Student A's own things: A and the teachers of A's studio; B and the other studio's teacher get 403. */
const ownedByA = (anon: Expect = "login", status = 200) => row(anon, status, 403, status, status, 403);
/** Pages for signed-out visitors only: signed-in people are sent on to /home. */
const anonymousOnly = (status = 200) => row(status, 302, 302, 302, 302, 302);

/** GET runs the loader; POST runs the action (sent with `actionMethod`, POST unless said otherwise). */
/** `query` is added to the GET url; `:name` in it is replaced by a fixture param. */
type Expectation = { GET: Row; POST?: Row; query?: string; actionMethod?: "POST" | "PUT" | "PATCH" | "DELETE" };

/**
 * One line per route path. Params come from FIXTURE_PARAMS below: `:takeId` is
 * student A's take, `:exerciseId` an exercise of A's studio, `:studentId` is A.
 * POST sends an empty form: authorised callers get 400 (nothing valid to do).
 */
const EXPECTED: Record<string, Expectation> = {
  "/": { GET: anonymousOnly(200) },
  home: { GET: signedIn() },
  logout: { GET: everyone(302), POST: everyone(302) },
  healthz: { GET: everyone(200) },
  login: { GET: anonymousOnly(), POST: anonymousOnly(400) },
  signup: { GET: anonymousOnly(), POST: anonymousOnly(400) },
  verify: { GET: everyone(410), query: "?token=not-a-real-token", POST: row("login", 302, 302, 302, 302, 302) },
  "forgot-password": { GET: everyone(200), POST: everyone(400) },
  "reset-password": { GET: everyone(410), POST: everyone(400) },
  // The invitation is for a new address: anyone holding the link may open it;
  // signed in as someone else, accepting is refused (403).
  "invite/:token": { GET: everyone(200), POST: row(400, 403, 403, 403, 403, 403) },
  students: { GET: teachers(), POST: teachers(400) },
  settings: { GET: signedIn(), POST: signedIn(400) },
  "switch-studio": { GET: everyone(302), POST: signedIn(400) },
  privacy: { GET: everyone(200) },
  "dev/mail": { GET: everyone(200) },
  "dev/mail/:id": { GET: everyone(200) },
  "api/me/export": { GET: row(401, 200, 200, 200, 200, 200) },
  "api/students/:studentId/export": { GET: row(401, 403, 403, 200, 200, 403) },
  // Takes API: `?student=:studentId` names student A.
  "api/takes": { GET: ownedByA(401), query: "?student=:studentId", POST: row(401, 400, 400, 403, 403, 403) },
  "api/takes/:takeId": { GET: ownedByA(401), POST: row(401, 204, 403, 403, 403, 403), actionMethod: "DELETE" },
  // The fixture take has no file on disk: whoever may see it is told the file is missing.
  "api/takes/:takeId/file": { GET: ownedByA(401, 404) },
  // A window of the take's analysis: refused exactly like the take's page.
  "api/takes/:takeId/window": { GET: ownedByA(401, 409), query: "?from=0" },
  // Take pages: uploading is for students; a take's page for its student and the studio's teachers,
  // changing it (move, replace, delete) for its student only.
  "takes/new": { GET: row("login", 200, 200, 403, 403, 403), POST: row("login", 200, 200, 403, 403, 403) },
  "takes/:takeId": { GET: ownedByA(), POST: row("login", 400, 403, 403, 403, 403) },
  // Progress board: teachers of the studio only; :studentId is student A (a student does not open the teacher pages about themself).
  board: { GET: teachers(), POST: teachers(400) },
  "students/:studentId": { GET: row("login", 403, 403, 200, 200, 403) },
  "reports/:studentId": { GET: row("login", 403, 403, 200, 200, 403), POST: row("login", 403, 403, 400, 400, 403) },
  // Every teacher sees the time zone; only the owner changes it (the other teacher owns their own studio).
  "studio/settings": { GET: teachers(), POST: row("login", 403, 403, 400, 403, 400) },
  "api/progress": { GET: row(401, 403, 403, 200, 200, 200) },
  "api/export/progress.csv": { GET: row(401, 403, 403, 200, 200, 200), query: "?from=2026-01-05&to=2026-03-29" },
  // Exercises, review queue, feedback, unsubscribe. :exerciseId is set for the whole studio.
  exercises: { GET: signedIn() },
  "exercises/new": { GET: teachers(), POST: teachers(400) },
  "exercises/:exerciseId": { GET: row("login", 200, 200, 200, 200, 403), POST: row("login", 403, 403, 400, 400, 403) },
  "exercises/:exerciseId/edit": {
    GET: row("login", 403, 403, 200, 200, 403),
    POST: row("login", 403, 403, 400, 400, 403),
  },
  review: { GET: teachers(), POST: teachers(400) },
  // Feedback is posted from the take page; opening its URL goes back to the take.
  "takes/:takeId/feedback": { GET: ownedByA("login", 302), POST: ownedByA("login", 400) },
  // Without a signed token there is nobody to unsubscribe, signed in or not.
  unsubscribe: { GET: everyone(400), POST: everyone(400) },
  "*": { GET: everyone(404) },
};

type RouteNode = { path?: string; index?: boolean; file: string; children?: RouteNode[] };
type Leaf = { key: string; url: string; files: string[] };

/** Every addressable route with the files of its layouts, outermost first. */
function leaves(nodes: RouteNode[], parentPath = "", parentFiles: string[] = []): Leaf[] {
  return nodes.flatMap((node) => {
    const full = [parentPath, node.path ?? ""].filter(Boolean).join("/");
    const files = [...parentFiles, node.file];
    const here =
      node.index || (node.path !== undefined && !node.children?.length) ? [{ key: full || "/", url: full, files }] : [];
    return [...here, ...(node.children ? leaves(node.children, full, files) : [])];
  });
}

const ALL = leaves(routes as RouteNode[]);

let FIXTURE_PARAMS: Record<string, string> = {};
const jars = {} as Record<Persona, CookieJar>;

function urlFor(leaf: Leaf, query = "") {
  const filled = leaf.url
    .split("/")
    .map((part) => {
      if (part === "*") return "no-such-page";
      if (!part.startsWith(":")) return part;
      const name = part.slice(1).replace(/\?$/, "");
      const value = FIXTURE_PARAMS[name];
      if (!value) throw new Error(`No fixture for :${name} (route ${leaf.key}): add one in accessMatrix.test.ts`);
      return encodeURIComponent(value);
    })
    .join("/");
  const filledQuery = query.replace(/:(\w+)/g, (_m, name: string) => encodeURIComponent(FIXTURE_PARAMS[name] ?? ""));
  return { url: `${ORIGIN}/${filled}${filledQuery}` };
}

type Module = { loader?: unknown; action?: unknown };

/** Sends the request through the app's real handler: root and layout middleware, then the route's loader or action. */
async function statusOf(leaf: Leaf, method: "GET" | "POST", persona: Persona, query = "", actionMethod = "POST") {
  const { url } = urlFor(leaf, method === "GET" ? query : "");
  const headers: Record<string, string> = {
    Cookie: jars[persona].header(),
    Origin: ORIGIN,
    "Sec-Fetch-Site": "same-origin",
  };
  const request =
    method === "POST"
      ? new Request(url, { method: actionMethod, body: new URLSearchParams(), headers })
      : new Request(url, { headers });
  return ask(request);
}

const app = useFreshApp();

/** Empties every table (between personas of a data-changing action) so each persona meets the same world. */
function wipeDatabase() {
  const client = db().$client;
  const tables = client
    .prepare(
      "select name from sqlite_master where type='table' and name not like 'sqlite_%' and name not like '__drizzle%'",
    )
    .all() as { name: string }[];
  client.pragma("foreign_keys = OFF");
  for (const t of tables) client.prepare(`delete from "${t.name}"`).run();
  client.pragma("foreign_keys = ON");
}

/** Two studios: A and B study with the teacher and co-teacher; the other teacher runs another studio. */
async function seedFixtures() {
  const studio = makeStudio("Tidewater Keys");
  const other = makeStudio("Harbour Lights");
  const people = {
    studentA: makeUser("dara@tidewater.example"),
    studentB: makeUser("felix@tidewater.example"),
    teacher: makeUser("ines@tidewater.example"),
    coTeacher: makeUser("marta@tidewater.example"),
    otherTeacher: makeUser("owen@harbour.example"),
  };
  join(studio.id, people.teacher.id, "owner");
  join(studio.id, people.coTeacher.id, "teacher");
  join(studio.id, people.studentA.id, "student");
  join(studio.id, people.studentB.id, "student");
  join(other.id, people.otherTeacher.id, "owner");
  const take = makeTakeRow(people.studentA.id, studio.id, "matrix-take");
  const exercise = makeExercise(studio.id);
  db()
    .insert(invitations)
    .values({
      studioId: studio.id,
      email: "new@tidewater.example",
      role: "student",
      tokenHash: hashToken("matrix-invite"),
      expiresAt: new Date(Date.now() + 86_400_000),
    })
    .run();
  const message = storeMessage(process.env.MAIL_CATCHER_DIR!, Buffer.from("Subject: Hello\r\n\r\nBody"), {
    from: "a@x",
    to: ["b@x"],
  });

  FIXTURE_PARAMS = {
    token: "matrix-invite",
    id: message.id,
    studentId: people.studentA.id,
    takeId: take.id,
    exerciseId: exercise.id,
  };
  jars.anon = new CookieJar();
  for (const [persona, user] of Object.entries(people)) {
    jars[persona as Persona] = new CookieJar().take((await createUserSession(user.id, "/home")).headers);
  }
}

beforeEach(async () => {
  process.env.MAIL_CATCHER_DIR = path.join(app.storageDir, "mail");
  resetEnvForTests();
  await seedFixtures();
  return () => {
    delete process.env.MAIL_CATCHER_DIR;
    resetEnvForTests();
  };
});

describe("access matrix", () => {
  it("has an expectation for every route in app/routes.ts, and none for routes that are gone", () => {
    const keys = ALL.map((l) => l.key);
    expect(
      keys.filter((k) => !(k in EXPECTED)),
      "routes without a line in EXPECTED",
    ).toEqual([]);
    expect(
      Object.keys(EXPECTED).filter((k) => !keys.includes(k)),
      "EXPECTED lines for routes that no longer exist",
    ).toEqual([]);
  });

  for (const leaf of ALL) {
    const expectation = EXPECTED[leaf.key];
    if (!expectation) continue;
    for (const method of ["GET", "POST"] as const) {
      const wanted = method === "GET" ? expectation.GET : expectation.POST;
      it(`${method} /${leaf.url}`, async () => {
        const module: Module = await import(path.resolve("app", leaf.files.at(-1)!));
        if (method === "POST" && !wanted) {
          expect(module.action, `/${leaf.url} has an action: add a POST row for it`).toBeUndefined();
          return;
        }
        const seen: Partial<Record<Persona, Expect>> = {};
        for (const persona of PERSONAS) {
          // An action may change data (delete a take…): every persona starts from the same fixtures.
          if (method === "POST") {
            wipeDatabase();
            await seedFixtures();
          }
          const result = await statusOf(leaf, method, persona, expectation.query, expectation.actionMethod);
          const isLogin = result.status === 302 && (result.location ?? "").startsWith("/login?redirectTo=");
          seen[persona] = isLogin ? "login" : result.status;
          // API routes answer refusals in JSON, never with a page or a redirect.
          if (leaf.url.startsWith("api/") && [401, 403].includes(result.status)) {
            expect(result.data, `${method} /${leaf.url} as ${persona}`).toEqual({ error: expect.any(String) });
          }
        }
        expect(seen).toEqual(wanted);
      });
    }
  }
});
