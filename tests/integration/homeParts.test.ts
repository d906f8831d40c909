// The home page's parts whose code the browser loads on its own (the teacher's week, the
// student's new feedback, the week-by-week chart, the list of takes): the server still renders each in place,
// in the HTML's own order, from the very first request after start-up, so the page is
// whole without scripts (no fallback with the content streamed in later behind it).
import { describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { comments } from "~/db/schema";
import { useFreshApp } from "../support/setup";
import { send } from "../support/app";
import { CookieJar, get, join, makeStudio, makeUser } from "./accountsKit";
import { insertHandTake } from "./progressKit";

useFreshApp();

const jarFor = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);
const pageText = async (response: Response) => (await response.text()).replaceAll("<!-- -->", "");
/**
 * Where the parts React renders after the page begin: each comes in a hidden div that a
 * script moves into place (React Router streams its own data that way, at the end).
 */
const streamedFrom = (html: string) => {
  const i = html.indexOf('<div hidden id="S:');
  return i < 0 ? html.length : i;
};

describe("the home page's parts loaded on their own", () => {
  it("are in the first answer's HTML, in place, for a teacher and for a student", async () => {
    const studio = makeStudio("Tidewater Keys").id;
    const teacher = makeUser("ines@tidewater.example", "Ines Marlowe").id;
    join(studio, teacher, "owner");
    const student = makeUser("dara@tidewater.example", "Dara Okafor").id;
    join(studio, student, "student");
    const take = insertHandTake({
      studentId: student,
      studioId: studio,
      at: new Date(Date.now() - 3_600_000).toISOString(),
      score: 72,
      changes: 4,
      motion: 8,
      best: 4,
    });
    db()
      .insert(comments)
      .values({ takeId: take.id, authorId: teacher, changeIdx: 1, body: "Hold the top note." })
      .run();

    const teacherPage = await send(get("/home", await jarFor(teacher)));
    expect(teacherPage.status).toBe(200);
    const teacherHtml = await pageText(teacherPage);
    expect(teacherHtml).not.toContain("Loading your studio's week");
    const practised = teacherHtml.indexOf("Not practised this week");
    expect(practised).toBeGreaterThan(0);
    expect(practised).toBeLessThan(streamedFrom(teacherHtml));

    const studentPage = await send(get("/home", await jarFor(student)));
    expect(studentPage.status).toBe(200);
    const studentHtml = await pageText(studentPage);
    expect(studentHtml).not.toContain("Loading the chart");
    expect(studentHtml).not.toContain("Loading your takes");
    // In the page's order: the new feedback, the due exercises, the week by week card, the takes.
    const at = (text: string) => {
      const i = studentHtml.indexOf(text);
      expect(i, text).toBeGreaterThan(0);
      return i;
    };
    const order = [
      at("New feedback (1)"),
      at("Hold the top note."),
      at("Due exercises"),
      at("Week by week"),
      at("Show the figures as a table"),
      at("Your takes"),
      at("column headers sort the list"),
      // The take's own row in the list (the feedback links to one of its changes instead).
      at(`href="/takes/${take.id}"`),
    ];
    expect(order).toEqual([...order].sort((a, b) => a - b));
    expect(order.at(-1)).toBeLessThan(streamedFrom(studentHtml));
  });
});
