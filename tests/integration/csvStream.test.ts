// The progress CSV is streamed: the header, then a few students' rows at a time, read
// from the database as the response is read. Its bytes must equal what the export wrote
// when it built the whole file as one string (the reference below is that code: every
// row from exportRows, one csv-stringify call), on the demo studio and on a studio with
// hundreds of students.
import { stringify } from "csv-stringify/sync";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { createUserSession } from "~/auth/session.server";
import { db } from "~/db/client.server";
import { users } from "~/db/schema";
import { EXPORT_BATCH, exportRows, pickStudents } from "~/models/board.server";
import { DEMO_TEACHER, seedDemoStudio } from "~/models/demoStudio.server";
import { CSV_COLUMNS, csvRecord } from "~/models/progressCsv.server";
import { studioTimeZone } from "~/models/progress.server";
import { parseProgressQuery } from "~/models/progressQuery.server";
import { seedDemoTakes } from "../../scripts/lib/seedTakes";
import { useFreshApp } from "../support/setup";
import { send } from "../support/app";
import { CookieJar, get, join, makeStudio, makeUser } from "./accountsKit";
import { insertHandTake } from "./progressKit";

useFreshApp();

const DAY = 86_400_000;
const jarFor = async (id: string) => new CookieJar().take((await createUserSession(id, "/home")).headers);
const isoDay = (d: Date) => d.toISOString().slice(0, 10);
const HEADER = stringify([CSV_COLUMNS], { record_delimiter: "\r\n" });

/** The export as it was built before it streamed: every row in memory, one string. */
function wholeFile(studioId: string, query: string): Uint8Array {
  const parsed = parseProgressQuery(new URL(`http://x/?${query}`), studioTimeZone(studioId), { requireDates: true });
  if (!parsed.ok) throw new Error(parsed.error);
  const q = parsed.query;
  const rows = exportRows(studioId, pickStudents(studioId, q.studentIds), q.fromWeek, q.toWeek).map(csvRecord);
  return new TextEncoder().encode(stringify([CSV_COLUMNS, ...rows], { record_delimiter: "\r\n" }));
}

/** The streamed answer, chunk by chunk as the response gives them. */
async function streamed(query: string, teacherId: string) {
  const response = await send(get(`/api/export/progress.csv?${query}`, await jarFor(teacherId)));
  expect(response.status).toBe(200);
  expect(response.headers.get("content-type")).toBe("text/csv; charset=utf-8");
  const chunks: Uint8Array[] = [];
  const reader = response.body!.getReader();
  for (let r = await reader.read(); !r.done; r = await reader.read()) chunks.push(r.value);
  const bytes = new Uint8Array(chunks.reduce((n, c) => n + c.length, 0));
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.length;
  }
  return { chunks, bytes };
}

// Seeding the demo studio analyses its takes, and the large studio makes 230 people: minutes on a busy machine.
describe("the streamed progress CSV", { timeout: 240_000 }, () => {
  it("writes the same bytes as the whole-file export on the demo studio", async () => {
    const { studioId } = await seedDemoStudio(db());
    const now = new Date();
    await seedDemoTakes(db(), studioId, now);
    const teacher = db().select({ id: users.id }).from(users).where(eq(users.email, DEMO_TEACHER.email)).get()!;
    const query = `from=${isoDay(new Date(now.getTime() - 84 * DAY))}&to=${isoDay(now)}`;
    const expected = wholeFile(studioId, query);
    const { bytes } = await streamed(query, teacher.id);
    // The demo's six students over about twelve weeks, and a header.
    const lines = new TextDecoder().decode(bytes).split("\r\n");
    expect(lines.length).toBeGreaterThan(6 * 12);
    expect(`${lines[0]}\r\n`).toBe(HEADER);
    expect(bytes).toEqual(expected);
  });

  it("sends a studio of 230 students in pieces of 50 students, with the same bytes as one string", async () => {
    const studio = makeStudio("Tidewater Keys").id;
    const teacher = makeUser("ines@tidewater.example", "Ines Marlowe").id;
    join(studio, teacher, "owner");
    const now = Date.now();
    for (let i = 0; i < 230; i++) {
      // Names a spreadsheet would read as a formula, and ones needing quotes, are in there too.
      const name = i % 37 === 0 ? `=Student ${i}` : i % 41 === 0 ? `Student "${i}", keys` : `Student ${i}`;
      const student = makeUser(`student${i}@tidewater.example`, name).id;
      join(studio, student, "student");
      if (i % 3 === 0)
        insertHandTake({
          studentId: student,
          studioId: studio,
          at: new Date(now - (i % 10) * 7 * DAY).toISOString(),
          score: 40 + (i % 50),
          changes: 6,
          motion: 12,
          best: 9,
          leaps: i % 4,
          techniques: i % 2 ? { inversion: 2 } : {},
        });
    }
    const query = `from=${isoDay(new Date(now - 20 * 7 * DAY))}&to=${isoDay(new Date(now))}`;
    const expected = wholeFile(studio, query);
    const { chunks, bytes } = await streamed(query, teacher);
    expect(new TextDecoder().decode(bytes).split("\r\n").length).toBeGreaterThan(230 * 20);
    expect(bytes).toEqual(expected);
    // The header, then one piece per 50 students (the last one shorter); the compression of the
    // production server may join pieces, the handler itself does not.
    expect(EXPORT_BATCH).toBe(50);
    expect(chunks).toHaveLength(1 + Math.ceil(230 / EXPORT_BATCH));
    expect(new TextDecoder().decode(chunks[0])).toBe(HEADER);
  });

  it("is just the header when the range has no weeks yet", async () => {
    const studio = makeStudio("Tidewater Keys").id;
    const teacher = makeUser("ines@tidewater.example", "Ines Marlowe").id;
    join(studio, teacher, "owner");
    join(studio, makeUser("dara@tidewater.example", "Dara Okafor").id, "student");
    const later = new Date(Date.now() + 30 * DAY);
    const query = `from=${isoDay(later)}&to=${isoDay(new Date(later.getTime() + 14 * DAY))}`;
    const { bytes } = await streamed(query, teacher);
    expect(bytes).toEqual(wholeFile(studio, query));
    expect(new TextDecoder().decode(bytes)).toBe(HEADER);
  });
});
