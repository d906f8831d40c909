import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import { exercises, memberships, studios, users } from "~/db/schema";

/** The invented demo scenario (Tidewater Keys, see the README): nothing here is real. */
export const DEMO_PASSWORD = "tidewater-keys";
export const DEMO_STUDIO = { name: "Tidewater Keys", timeZone: "America/New_York" };
export const DEMO_TEACHER = { name: "Ines Marlowe", email: "ines@tidewater.example" };
export const DEMO_STUDENTS = [
  "Dara Okafor",
  "Felix Brandt",
  "Yuki Tanabe",
  "Samir Haddad",
  "Lena Voss",
  "Owen Pryce",
].map((name) => ({ name, email: `${name.split(" ")[0].toLowerCase()}@tidewater.example` }));

export const DEMO_EXERCISES = [
  {
    title: "Three-chord smoothing in D",
    keys: ["D"],
    progression: "I IV V I",
    focusTechniques: ["inversion"],
    tempo: 72,
    dueInDays: 3,
    instructions: "Keep one hand on the keys the whole time: pick inversions so each note moves a step or stays put.",
  },
  {
    title: "Sunday ballad in A♭",
    keys: ["Ab"],
    progression: "vi IV I V",
    focusTechniques: ["open-voicing"],
    tempo: 66,
    dueInDays: 5,
    instructions: "Spread each triad by dropping its middle note an octave. Listen for the top line.",
  },
  {
    title: "Minor colour in G minor",
    keys: ["Gm"],
    progression: "iiø7 V7 i",
    focusTechniques: ["added-second"],
    tempo: 60,
    dueInDays: 8,
    instructions: "Add the 9th to the final minor chord, inside the voicing or as a grace note up to the third.",
  },
  {
    title: "Falling bass in E♭",
    keys: ["Eb"],
    progression: "Eb Bb/D Cm Cm/Bb Ab",
    focusTechniques: ["slash-bass"],
    tempo: 80,
    dueInDays: 10,
    instructions: "Left hand walks down a step at a time; right hand stays close.",
  },
];

function isoDate(d: Date) {
  return d.toISOString().slice(0, 10);
}

/**
 * Creates the demo studio when it is missing. Idempotent: a second run finds
 * the teacher and changes nothing. Returns whether anything was created.
 */
export async function seedDemoStudio(database: Db, now = new Date()): Promise<{ created: boolean; studioId: string }> {
  const existing = database.select().from(users).where(eq(users.email, DEMO_TEACHER.email)).get();
  if (existing) {
    const m = database.select().from(memberships).where(eq(memberships.userId, existing.id)).get();
    return { created: false, studioId: m?.studioId ?? "" };
  }
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
  return database.transaction((tx) => {
    const studio = tx.insert(studios).values(DEMO_STUDIO).returning().get();
    const teacher = tx
      .insert(users)
      .values({ ...DEMO_TEACHER, passwordHash, emailVerifiedAt: now })
      .returning()
      .get();
    tx.insert(memberships).values({ userId: teacher.id, studioId: studio.id, role: "owner" }).run();
    for (const s of DEMO_STUDENTS) {
      const student = tx
        .insert(users)
        .values({ ...s, passwordHash, emailVerifiedAt: now })
        .returning()
        .get();
      tx.insert(memberships).values({ userId: student.id, studioId: studio.id, role: "student" }).run();
    }
    for (const { dueInDays, ...e } of DEMO_EXERCISES) {
      tx.insert(exercises)
        .values({
          ...e,
          studioId: studio.id,
          createdById: teacher.id,
          dueDate: isoDate(new Date(now.getTime() + dueInDays * 86_400_000)),
        })
        .run();
    }
    return { created: true, studioId: studio.id };
  });
}
