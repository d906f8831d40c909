import { describe, expect, it } from "vitest";
import { db } from "~/db/client.server";
import { useFreshApp } from "../support/setup";

useFreshApp();

type Row = Record<string, unknown>;
const all = (sql: string) => db().$client.prepare(sql).all() as Row[];

describe("a freshly migrated database", () => {
  it("has every core table", () => {
    const tables = all("select name from sqlite_master where type='table'").map((r) => r.name);
    for (const t of [
      "users",
      "studios",
      "memberships",
      "sessions",
      "exercises",
      "exercise_assignees",
      "takes",
      "take_metrics",
    ]) {
      expect(tables).toContain(t);
    }
    // A take's chords and changes live only in the analysis JSON of take_metrics.
    expect(tables).not.toContain("chord_events");
    expect(tables).not.toContain("change_results");
  });

  it("has the foreign keys the data model relies on", () => {
    const fks = (table: string) =>
      all(`pragma foreign_key_list(${table})`).map((r) => `${r.from}->${r.table}.${r.to}:${r.on_delete}`);
    expect(fks("memberships")).toEqual(
      expect.arrayContaining(["user_id->users.id:CASCADE", "studio_id->studios.id:CASCADE"]),
    );
    expect(fks("sessions")).toEqual(
      expect.arrayContaining(["user_id->users.id:CASCADE", "active_studio_id->studios.id:SET NULL"]),
    );
    expect(fks("exercises")).toEqual(
      expect.arrayContaining(["studio_id->studios.id:CASCADE", "created_by_id->users.id:SET NULL"]),
    );
    expect(fks("exercise_assignees")).toEqual(
      expect.arrayContaining(["exercise_id->exercises.id:CASCADE", "user_id->users.id:CASCADE"]),
    );
    expect(fks("takes")).toEqual(
      expect.arrayContaining([
        "student_id->users.id:CASCADE",
        "studio_id->studios.id:CASCADE",
        "exercise_id->exercises.id:SET NULL",
      ]),
    );
    expect(fks("take_metrics")).toEqual(["take_id->takes.id:CASCADE"]);
  });

  it("has the unique constraints and indexes the lists and the board use", () => {
    const indexes = (table: string) =>
      Object.fromEntries(all(`pragma index_list(${table})`).map((r) => [r.name, r.unique === 1]));
    expect(indexes("users")).toMatchObject({ users_email_unique: true });
    expect(indexes("memberships")).toMatchObject({
      memberships_user_studio_unique: true,
      memberships_studio_role_idx: false,
    });
    expect(indexes("takes")).toMatchObject({
      takes_student_hash_unique: true,
      takes_student_recorded_idx: false,
      takes_studio_week_idx: false,
      takes_studio_created_idx: false,
      takes_exercise_idx: false,
    });
    expect(indexes("sessions")).toMatchObject({ sessions_user_idx: false });
  });

  it("enforces NOT NULL, foreign keys and WAL", () => {
    expect(db().$client.pragma("foreign_keys", { simple: true })).toBe(1);
    expect(db().$client.pragma("journal_mode", { simple: true })).toBe("wal");
    expect(() => db().$client.prepare("insert into users (id, email, name) values ('u', 'a@b.c', 'A')").run()).toThrow(
      /NOT NULL/,
    );
    expect(() =>
      db()
        .$client.prepare("insert into memberships (id, user_id, studio_id, role, status, created_at) values ('m','nobody','nowhere','student','active',0)")
        .run(),
    ).toThrow(/FOREIGN KEY/);
  });
});
