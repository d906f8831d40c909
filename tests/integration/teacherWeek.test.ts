// The teacher's week: home's facts (not practised, dropped, new since the last
// visit, due soon, first steps), the list of takes to listen to (filters,
// server paging, marking several at once) and the board status checked against
// its own numbers is in demoBoardStatus.test.ts.
import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { exercises, invitations, studios, studioVisits, takeReviews, takes, users } from "~/db/schema";
import { strFromU8, unzipSync } from "fflate";
import { buildPersonalExport, deletePersonData } from "~/models/personalData.server";
import { teacherWeek, SITTING_MS } from "~/models/teacherHome.server";
import { listeningPage, markHeard, readListeningQuery } from "~/models/listening.server";
import { useFreshApp } from "../support/setup";
import { ask } from "../support/app";
import { CookieJar, get, join, makeExercise, makeStudio, makeUser, post } from "./accountsKit";
import { insertHandTake } from "./progressKit";

useFreshApp();

const DAY = 86_400_000;
const NOW = new Date("2026-12-02T12:00:00Z"); // a Wednesday, ISO week 49
const weeksAgo = (n: number, hours = 0) => new Date(NOW.getTime() - n * 7 * DAY + hours * 3_600_000).toISOString();
const jarFor = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);

let s: {
  studio: string;
  other: string;
  teacher: string;
  dara: string;
  felix: string;
  samir: string;
  yuki: string;
  ex: string;
  ex2: string;
};

beforeEach(() => {
  const studio = makeStudio("Tidewater Keys");
  const other = makeStudio("Harbour Lights");
  const teacher = makeUser("ines@tidewater.example", "Ines Marlowe");
  join(studio.id, teacher.id, "owner");
  const people = {
    dara: makeUser("dara@tidewater.example", "Dara Okafor"),
    felix: makeUser("felix@tidewater.example", "Felix Brandt"),
    samir: makeUser("samir@tidewater.example", "Samir Haddad"),
    yuki: makeUser("yuki@tidewater.example", "Yuki Tanabe"),
  };
  for (const p of Object.values(people)) join(studio.id, p.id, "student");
  const ex = makeExercise(studio.id).id;
  const ex2 = makeExercise(studio.id, "Sunday ballad in A♭").id;
  s = {
    studio: studio.id,
    other: other.id,
    teacher: teacher.id,
    ex,
    ex2,
    ...Object.fromEntries(Object.entries(people).map(([k, v]) => [k, v.id])),
  } as typeof s;
});

/** A hand-made analysed take, arrived `arrivedAt` (the upload time "new since" counts from). */
function take(studentId: string, at: string, score: number, opts: { exerciseId?: string; arrivedAt?: string } = {}) {
  const t = insertHandTake({
    studentId,
    studioId: s.studio,
    at,
    score,
    changes: 4,
    motion: 8,
    best: 4,
    exerciseId: opts.exerciseId,
  });
  db()
    .update(takes)
    .set({ createdAt: new Date(opts.arrivedAt ?? at) })
    .where(eq(takes.id, t.id))
    .run();
  return t.id;
}

describe("teacher home", () => {
  it("lists who has not practised this week and who dropped, with the figures behind it", () => {
    for (const n of [5, 4, 3]) take(s.felix, weeksAgo(n), 80);
    for (const n of [2, 1, 0]) take(s.felix, weeksAgo(n), 70); // 80 → 70: dropped
    for (const n of [5, 4, 3, 2, 1, 0]) take(s.dara, weeksAgo(n), 60); // level
    take(s.samir, weeksAgo(2), 50); // nothing this week
    const week = teacherWeek(s.studio, { id: s.teacher, emailVerified: true }, NOW);
    expect(week.notPractised.map((x) => x.name)).toEqual(["Samir Haddad", "Yuki Tanabe"]);
    expect(week.notPractised.find((x) => x.name === "Yuki Tanabe")?.lastTakeAt).toBeNull();
    expect(week.dropped).toEqual([
      { id: s.felix, name: "Felix Brandt", lastTakeAt: weeksAgo(0), compare: { before: 80, recent: 70 } },
    ]);
  });

  it("counts takes new since the previous sitting; a reload within half an hour keeps the same 'since'", () => {
    const first = teacherWeek(s.studio, { id: s.teacher, emailVerified: true }, NOW);
    expect(first.since).toBeNull(); // first visit: the last seven days stand in
    const later = new Date(NOW.getTime() + 2 * DAY);
    take(s.dara, new Date(NOW.getTime() + DAY).toISOString(), 70); // arrives between the two visits
    take(s.yuki, new Date(NOW.getTime() - DAY).toISOString(), 70); // arrived before the first visit
    const second = teacherWeek(s.studio, { id: s.teacher, emailVerified: true }, later);
    expect(second.since).toBe(NOW.toISOString());
    expect(second.newTakes.total).toBe(1);
    expect(second.newTakes.latest.map((t) => t.studentName)).toEqual(["Dara Okafor"]);
    // A reload ten minutes on is the same sitting: the same take is still new.
    const reload = teacherWeek(
      s.studio,
      { id: s.teacher, emailVerified: true },
      new Date(later.getTime() + 10 * 60_000),
    );
    expect(reload.since).toBe(NOW.toISOString());
    expect(reload.newTakes.total).toBe(1);
    // The next sitting counts from the reload.
    const next = teacherWeek(
      s.studio,
      { id: s.teacher, emailVerified: true },
      new Date(later.getTime() + 10 * 60_000 + SITTING_MS + 1),
    );
    expect(next.since).toBe(new Date(later.getTime() + 10 * 60_000).toISOString());
    expect(next.newTakes.total).toBe(0);
  });

  it("lists exercises due in the next seven days of the studio's calendar, not archived or later ones", () => {
    db().update(studios).set({ timeZone: "America/New_York" }).where(eq(studios.id, s.studio)).run();
    // 2026-12-02 12:00 UTC is 07:00 on 2 December in New York: due dates 2 … 9 December are in.
    db().update(exercises).set({ dueDate: "2026-12-09" }).where(eq(exercises.id, s.ex)).run();
    db().update(exercises).set({ dueDate: "2026-12-10" }).where(eq(exercises.id, s.ex2)).run();
    const archived = makeExercise(s.studio, "Old one").id;
    db().update(exercises).set({ dueDate: "2026-12-03", archivedAt: NOW }).where(eq(exercises.id, archived)).run();
    const overdue = makeExercise(s.studio, "Last week's").id;
    db().update(exercises).set({ dueDate: "2026-12-01" }).where(eq(exercises.id, overdue)).run();
    take(s.dara, weeksAgo(0), 70, { exerciseId: s.ex });
    const week = teacherWeek(s.studio, { id: s.teacher, emailVerified: true }, NOW);
    expect(week.today).toBe("2026-12-02");
    expect(week.dueSoon).toEqual([
      { id: s.ex, title: "Three-chord smoothing in D", dueDate: "2026-12-09", setFor: 4, handedIn: 1 },
    ]);
  });

  it("shows a new studio's first steps and ticks each off from what has really happened", async () => {
    const fresh = makeStudio("Quayside Keys");
    const owner = makeUser("nell@quayside.example", "Nell Aster", false);
    join(fresh.id, owner.id, "owner");
    const steps = () =>
      teacherWeek(
        fresh.id,
        {
          id: owner.id,
          emailVerified: db().select().from(users).where(eq(users.id, owner.id)).get()!.emailVerifiedAt !== null,
        },
        NOW,
      ).firstRun;
    expect(steps()).toEqual([
      { id: "confirm-email", done: false },
      { id: "invite-students", done: false },
      { id: "set-exercise", done: false },
    ]);
    db().update(users).set({ emailVerifiedAt: NOW }).where(eq(users.id, owner.id)).run();
    db()
      .insert(invitations)
      .values({
        studioId: fresh.id,
        email: "kit@quayside.example",
        role: "student",
        tokenHash: "h1",
        invitedById: owner.id,
        expiresAt: new Date(NOW.getTime() + DAY),
      })
      .run();
    expect(steps()?.map((x) => x.done)).toEqual([true, true, false]);
    makeExercise(fresh.id);
    expect(steps()).toBeNull(); // all done: the list goes away
    // Through the page: the loader hands the teacher's week to the view.
    const page = await ask<{ teacher: { week: { firstRun: unknown; notPractised: unknown[] } } }>(
      get("/home", await jarFor(owner.id)),
    );
    const d = page.data;
    expect(d.teacher.week.firstRun).toBeNull();
    expect(d.teacher.week.notPractised).toEqual([]);
  });
});

describe("home visits as personal data", () => {
  it("are in the teacher's data download and go with the account", async () => {
    teacherWeek(s.studio, { id: s.teacher, emailVerified: true }, NOW);
    const files = unzipSync(await buildPersonalExport(s.teacher));
    const doc = JSON.parse(strFromU8(files["nearnote-data.json"])) as {
      homeVisits: { studio: string; lastVisitAt: string }[];
    };
    expect(doc.homeVisits).toEqual([{ studio: "Tidewater Keys", lastVisitAt: NOW.toISOString(), sinceAt: null }]);
    await deletePersonData(s.teacher);
    expect(db().select().from(studioVisits).all()).toEqual([]);
  });
});

describe("takes to listen to", () => {
  let ids: string[];
  beforeEach(() => {
    // 30 takes, one an hour, alternating students and exercises; arrival order is the reverse of playing order.
    ids = Array.from({ length: 30 }, (_, i) =>
      take([s.dara, s.felix, s.yuki][i % 3], weeksAgo(1, i), 60, {
        exerciseId: i % 2 ? s.ex : undefined,
        arrivedAt: weeksAgo(0, -i),
      }),
    );
  });

  it("puts the newest recorded take first, pages by 25 on the server, and can sort by arrival", () => {
    const first = listeningPage(s.studio, readListeningQuery(new URLSearchParams()));
    expect(first.total).toBe(30);
    expect(first.pages).toBe(2);
    expect(first.rows).toHaveLength(25);
    expect(first.rows[0].id).toBe(ids[29]);
    const recorded = first.rows.map((r) => r.recordedAt);
    expect(recorded).toEqual([...recorded].sort().reverse());
    const second = listeningPage(s.studio, readListeningQuery(new URLSearchParams("page=2")));
    expect(second.rows.map((r) => r.id)).toEqual(ids.slice(0, 5).reverse());
    // A page past the end shows the last page rather than nothing.
    expect(listeningPage(s.studio, readListeningQuery(new URLSearchParams("page=9"))).page).toBe(2);
    const arrived = listeningPage(s.studio, readListeningQuery(new URLSearchParams("sort=arrived")));
    expect(arrived.rows[0].id).toBe(ids[0]);
    const oldest = listeningPage(s.studio, readListeningQuery(new URLSearchParams("sort=oldest")));
    expect(oldest.rows[0].id).toBe(ids[0]);
  });

  it("filters by student, by exercise and by free practice", () => {
    const dara = listeningPage(s.studio, readListeningQuery(new URLSearchParams({ student: s.dara })));
    expect(dara.total).toBe(10);
    expect(new Set(dara.rows.map((r) => r.studentName))).toEqual(new Set(["Dara Okafor"]));
    const onExercise = listeningPage(s.studio, readListeningQuery(new URLSearchParams({ exercise: s.ex })));
    expect(onExercise.total).toBe(15);
    expect(new Set(onExercise.rows.map((r) => r.exerciseTitle))).toEqual(new Set(["Three-chord smoothing in D"]));
    const free = listeningPage(s.studio, readListeningQuery(new URLSearchParams({ exercise: "free" })));
    expect(free.total).toBe(15);
    expect(free.rows.every((r) => r.exerciseTitle === null)).toBe(true);
    // Both at once: Dara's takes are i = 0, 3, 6 …; odd ones are on the exercise: 3, 9, 15, 21, 27.
    expect(
      listeningPage(s.studio, readListeningQuery(new URLSearchParams({ student: s.dara, exercise: s.ex }))).total,
    ).toBe(5);
    // A bad sort or page falls back to the default.
    expect(readListeningQuery(new URLSearchParams("sort=loudest&page=-3"))).toMatchObject({ sort: "newest", page: 1 });
  });

  it("marks several takes heard in one action, keeps the filters, and puts them back with undo", async () => {
    const jar = await jarFor(s.teacher);
    const body = new URLSearchParams({ intent: "review" });
    for (const id of ids.slice(0, 3)) body.append("takeId", id);
    const request = new Request(`http://127.0.0.1:3000/review?student=${s.dara}&page=1`, {
      method: "POST",
      body,
      headers: { Cookie: jar.header() },
    });
    const done = await ask(request);
    expect(done.status).toBe(302);
    const back = new URL(done.location!, "http://x");
    expect(back.searchParams.get("student")).toBe(s.dara);
    expect(back.searchParams.getAll("undo")).toEqual(ids.slice(0, 3));
    expect(listeningPage(s.studio, readListeningQuery(new URLSearchParams())).total).toBe(27);
    expect(
      db()
        .select()
        .from(takeReviews)
        .all()
        .map((r) => r.reviewedById),
    ).toEqual([s.teacher, s.teacher, s.teacher]);
    // One row's own button marks that take alone, whatever else is ticked.
    const only = new URLSearchParams({ intent: "review", only: ids[5] });
    only.append("takeId", ids[6]);
    await ask(
      new Request("http://127.0.0.1:3000/review", { method: "POST", body: only, headers: { Cookie: jar.header() } }),
    );
    expect(listeningPage(s.studio, readListeningQuery(new URLSearchParams())).total).toBe(26);
    // Undo puts the three back.
    const undo = new URLSearchParams({ intent: "unreview" });
    for (const id of ids.slice(0, 3)) undo.append("takeId", id);
    await ask(
      new Request("http://127.0.0.1:3000/review", { method: "POST", body: undo, headers: { Cookie: jar.header() } }),
    );
    expect(listeningPage(s.studio, readListeningQuery(new URLSearchParams())).total).toBe(29);
    // Nothing ticked is refused with a message.
    expect((await ask(post("/review", { intent: "review" }, jar))).status).toBe(400);
  });

  it("never marks another studio's take", () => {
    const outsider = makeUser("oona@harbour.example", "Oona Reed");
    join(s.other, outsider.id, "student");
    const theirs = insertHandTake({ studentId: outsider.id, studioId: s.other, at: weeksAgo(0), score: 50 }).id;
    expect(markHeard("review", [theirs, ids[0]], s.teacher, s.studio)).toBe(1);
    expect(
      db()
        .select()
        .from(takeReviews)
        .all()
        .map((r) => r.takeId),
    ).toEqual([ids[0]]);
  });

  it("shows the page with the studio's time zone for a teacher and refuses a student", async () => {
    db().update(studios).set({ timeZone: "Asia/Tokyo" }).where(eq(studios.id, s.studio)).run();
    const page = await ask<{ timeZone: string; list: { total: number } }>(
      get("/review?student=" + s.felix, await jarFor(s.teacher)),
    );
    const d = page.data;
    expect(d.timeZone).toBe("Asia/Tokyo");
    expect(d.list.total).toBe(10);
    expect((await ask(get("/review", await jarFor(s.dara)))).status).toBe(403);
  });
});
