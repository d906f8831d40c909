// Long lists paged on the server, through the app's real request handler: a student's
// takes on their home page (sorted by a column), a teacher's view of one student's takes,
// and the progress board's student table beyond one page of 50 (filters, sorting).
// Each checks a later page's rows and the plain links that lead to the pages around it.
import { beforeEach, describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import type { BoardTable } from "~/models/boardTable.server";
import type { TakeList } from "~/models/takeList.server";
import { useFreshApp } from "../support/setup";
import { ask, send } from "../support/app";
import { CookieJar, get, join, makeExercise, makeStudio, makeUser } from "./accountsKit";
import { insertHandTake } from "./progressKit";

useFreshApp();

const HOUR = 3_600_000;
const jarFor = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);
/** Links in a page's HTML as React writes them (& as &amp;). */
const html = (href: string) => `href="${href.replaceAll("&", "&amp;")}"`;
/** A page's HTML without the markers React puts between neighbouring pieces of text. */
const pageText = async (response: Response) => (await response.text()).replaceAll("<!-- -->", "");

describe("a student's takes on the home page", () => {
  let studio: string;
  let student: string;
  /** The student's takes, newest first; `score` is 40 + i (the oldest scores lowest). */
  let newestFirst: string[];
  let failed: string;

  beforeEach(() => {
    studio = makeStudio("Tidewater Keys").id;
    student = makeUser("dara@tidewater.example", "Dara Okafor").id;
    join(studio, student, "student");
    const other = makeUser("felix@tidewater.example", "Felix Brandt").id;
    join(studio, other, "student");
    const exercise = makeExercise(studio).id;
    const start = Date.now() - 60 * HOUR;
    const ids = Array.from(
      { length: 44 },
      (_, i) =>
        insertHandTake({
          studentId: student,
          studioId: studio,
          at: new Date(start + i * HOUR).toISOString(),
          score: 40 + i,
          changes: 4,
          motion: 8,
          best: 4,
          exerciseId: i % 2 ? exercise : undefined,
        }).id,
    );
    // The newest take could not be analysed: no figures, so it sorts after every analysed take.
    failed = insertHandTake({
      studentId: student,
      studioId: studio,
      at: new Date(start + 44 * HOUR).toISOString(),
      failed: true,
    }).id;
    newestFirst = [failed, ...ids.reverse()];
    // Another student's takes never show on this student's list.
    insertHandTake({ studentId: other, studioId: studio, at: new Date(start).toISOString(), score: 99 });
  });

  const homeList = async (query: string) => {
    const answer = await ask<{ student: { takes: TakeList } }>(get(`/home${query}`, await jarFor(student)));
    expect(answer.status).toBe(200);
    return answer.data.student.takes;
  };

  it("pages by 20, newest first, with links to the pages before and after", async () => {
    const first = await homeList("");
    expect(first).toMatchObject({ total: 45, page: 1, pageSize: 20 });
    expect(first.rows.map((r) => r.id)).toEqual(newestFirst.slice(0, 20));
    expect(first.pager).toEqual({ page: 1, pages: 3, prev: null, next: "/home?page=2#takes" });

    const second = await homeList("?page=2");
    expect(second.rows.map((r) => r.id)).toEqual(newestFirst.slice(20, 40));
    // newestFirst[20] is the 25th take played (i = 24); motion 8 against a best of 4 is 50 % smooth.
    expect(second.rows[0]).toMatchObject({ score: 40 + 24, smoothness: "50%", chords: 5, failed: false });
    expect(second.pager).toEqual({ page: 2, pages: 3, prev: "/home#takes", next: "/home?page=3#takes" });

    const last = await homeList("?page=3");
    expect(last.rows.map((r) => r.id)).toEqual(newestFirst.slice(40));
    expect(last.pager.next).toBeNull();
    // A page past the end shows the last one rather than nothing; a bad page number the first.
    expect((await homeList("?page=12")).rows.map((r) => r.id)).toEqual(newestFirst.slice(40));
    expect((await homeList("?page=-1")).page).toBe(1);
  });

  it("writes the page's links into the HTML, so paging works without scripts", async () => {
    const page = await send(get("/home?page=2", await jarFor(student)));
    expect(page.status).toBe(200);
    const body = await pageText(page);
    expect(body).toContain(html("/home#takes"));
    expect(body).toContain(html("/home?page=3#takes"));
    expect(body).toContain("Page 2 of 3");
    expect(body).toContain("Takes 21–40 of 45");
    // The second page's first row links to its take.
    expect(body).toContain(html(`/takes/${newestFirst[20]}`));
    expect(body).not.toContain(html(`/takes/${newestFirst[19]}`));
  });

  it("sorts on the server by the column the address names, failed takes last either way", async () => {
    const byScore = await homeList("?sort=score&dir=asc");
    expect(byScore.rows.map((r) => r.score)).toEqual(Array.from({ length: 20 }, (_, i) => 40 + i));
    // Each header links to its order: the score column the other way round, the others their first way.
    expect(byScore.sortLinks.score).toBe("/home?sort=score&dir=desc#takes");
    expect(byScore.sortLinks.exercise).toBe("/home?sort=exercise&dir=asc#takes");
    expect(byScore.sortLinks.date).toBe("/home#takes");
    // The page after keeps the order.
    expect(byScore.pager.next).toBe("/home?sort=score&dir=asc&page=2#takes");
    const lastAscending = await homeList("?sort=score&dir=asc&page=3");
    expect(lastAscending.rows.at(-1)).toMatchObject({ id: failed, failed: true, score: null });

    const highest = await homeList("?sort=score&dir=desc");
    expect(highest.rows[0].score).toBe(83);
    const lastDescending = await homeList("?sort=score&dir=desc&page=3");
    expect(lastDescending.rows.at(-1)?.id).toBe(failed);

    // An unknown column falls back to the newest first.
    const fallback = await homeList("?sort=loudness");
    expect(fallback.sort).toBe("date");
    expect(fallback.rows[0].id).toBe(failed);
  });

  it("lists the same pages on the teacher's view of the student, keeping the chosen period", async () => {
    const teacher = makeUser("ines@tidewater.example", "Ines Marlowe").id;
    join(studio, teacher, "owner");
    const period = "from=2026-09-01&to=2026-12-31";
    const answer = await ask<{
      takes: Array<{ id: string }>;
      takesTotal: number;
      takesPager: TakeList["pager"];
    }>(get(`/students/${student}?${period}&page=2`, await jarFor(teacher)));
    expect(answer.status).toBe(200);
    expect(answer.data.takesTotal).toBe(45);
    expect(answer.data.takes.map((t) => t.id)).toEqual(newestFirst.slice(20, 40));
    expect(answer.data.takesPager).toEqual({
      page: 2,
      pages: 3,
      prev: `/students/${student}?${period}#takes-heading`,
      next: `/students/${student}?${period}&page=3#takes-heading`,
    });
  });
});

describe("the progress board's student table", () => {
  let studio: string;
  let teacher: string;
  /** 120 students named "Student 001" … "Student 120", and their ids. */
  let names: string[];
  let ids: string[];

  beforeEach(() => {
    studio = makeStudio("Tidewater Keys").id;
    teacher = makeUser("ines@tidewater.example", "Ines Marlowe").id;
    join(studio, teacher, "owner");
    names = Array.from({ length: 120 }, (_, i) => `Student ${String(i + 1).padStart(3, "0")}`);
    ids = names.map((name, i) => {
      const id = makeUser(`student${i + 1}@tidewater.example`, name).id;
      join(studio, id, "student");
      return id;
    });
    // Ten students played this week, each with a score of their own (the 10th best).
    for (let i = 0; i < 10; i++) {
      insertHandTake({
        studentId: ids[i * 7],
        studioId: studio,
        at: new Date(Date.now() - HOUR).toISOString(),
        score: 50 + i * 5,
        changes: 4,
        motion: 8,
        best: 4,
      });
    }
  });

  const board = async (query: string) => {
    const answer = await ask<{ table: BoardTable; students: unknown[] }>(get(`/board${query}`, await jarFor(teacher)));
    expect(answer.status).toBe(200);
    return answer.data;
  };

  it("sends 50 students a page, by name, with links to the pages around it", async () => {
    const first = await board("");
    expect(first.table).toMatchObject({ matching: 120, total: 120, pageSize: 50 });
    expect(first.table.rows.map((r) => r.name)).toEqual(names.slice(0, 50));
    expect(first.table.pager).toEqual({ page: 1, pages: 3, prev: null, next: "/board?page=2#students" });
    // The chart's choices still offer every student.
    expect(first.students).toHaveLength(120);

    const second = await board("?page=2");
    expect(second.table.rows.map((r) => r.name)).toEqual(names.slice(50, 100));
    expect(second.table.pager).toEqual({
      page: 2,
      pages: 3,
      prev: "/board#students",
      next: "/board?page=3#students",
    });
    const third = await board("?page=3");
    expect(third.table.rows.map((r) => r.name)).toEqual(names.slice(100));
    expect(third.table.pager.next).toBeNull();
  });

  it("writes the second page's rows and links into the HTML", async () => {
    const page = await send(get("/board?page=2", await jarFor(teacher)));
    expect(page.status).toBe(200);
    const body = await pageText(page);
    expect(body).toContain(html("/board#students"));
    expect(body).toContain(html("/board?page=3#students"));
    expect(body).toContain("120 of 120 students · 51–100 shown");
    // Each row links to its student's page: those of the second page only.
    expect(body).toContain(html(`/students/${ids[50]}`));
    expect(body).toContain(html(`/students/${ids[99]}`));
    expect(body).not.toContain(html(`/students/${ids[49]}`));
    expect(body).not.toContain(html(`/students/${ids[100]}`));
  });

  it("sorts by a column on the server, students without a figure last, and keeps the order across pages", async () => {
    const byScore = await board("?sort=score&dir=desc");
    const scores = byScore.table.rows.slice(0, 10).map((r) => r.thisWeek.score);
    expect(scores).toEqual([95, 90, 85, 80, 75, 70, 65, 60, 55, 50]);
    expect(byScore.table.rows.slice(10).every((r) => r.thisWeek.score === null)).toBe(true);
    expect(byScore.table.sortLinks.score).toBe("/board?sort=score&dir=asc#students");
    expect(byScore.table.sortLinks.name).toBe("/board#students");
    expect(byScore.table.pager.next).toBe("/board?sort=score&dir=desc&page=2#students");
    const ascending = await board("?sort=score&dir=asc");
    expect(ascending.table.rows.slice(0, 10).map((r) => r.thisWeek.score)).toEqual([
      50, 55, 60, 65, 70, 75, 80, 85, 90, 95,
    ]);
    // Later pages hold only students without a score this week, still by the board's own order (name).
    const second = await board("?sort=score&dir=desc&page=2");
    expect(second.table.rows.map((r) => r.name)).toEqual(
      names.filter((_, i) => !(i % 7 === 0 && i < 70)).slice(40, 90),
    );
  });

  it("filters by part of a name and by status, then pages what is left", async () => {
    const named = await board("?name=student+0");
    expect(named.table.matching).toBe(99);
    expect(named.table.rows.map((r) => r.name)).toEqual(names.slice(0, 50));
    const secondNamed = await board("?name=student+0&page=2");
    expect(secondNamed.table.rows.map((r) => r.name)).toEqual(names.slice(50, 99));
    expect(secondNamed.table.pager.prev).toBe("/board?name=student+0#students");

    // Students who have never sent a take are "new"; the ten who played this week are not.
    const fresh = await board("?status=new");
    expect(fresh.table.matching).toBe(110);
    expect(fresh.table.rows.every((r) => r.status === "new")).toBe(true);
    // A status that does not exist is ignored rather than an error.
    expect((await board("?status=sleeping")).table.matching).toBe(120);
  });
});
