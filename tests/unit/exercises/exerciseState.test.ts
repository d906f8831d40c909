// One rule for a student's state of an exercise (home, list of exercises, exercise page).
// Dates are counted in whole calendar days of the studio's calendar.
import { describe, expect, it } from "vitest";
import { byState, dueWords, exerciseState } from "../../../app/utils/exerciseState";

const analysed = { status: "analysed" };
const failed = { status: "failed" };

describe("exerciseState", () => {
  it("is done once every key has an analysed take, whatever the due date", () => {
    const s = exerciseState(
      { dueDate: "2026-11-01" },
      [
        { key: "D", takes: [failed, analysed] },
        { key: "Ab", takes: [analysed] },
      ],
      "2026-12-02",
    );
    expect(s).toMatchObject({ kind: "done", label: "Done", keysDone: 2, keysTotal: 2 });
  });

  it("a failed take alone does not count: the key is still to send", () => {
    const s = exerciseState({ dueDate: "2026-12-05" }, [{ key: "D", takes: [failed] }], "2026-12-02");
    expect(s).toMatchObject({ kind: "due", label: "Due in 3 days", keysDone: 0, detail: "A take in D still to send." });
  });

  it("is overdue after its due day and due on the day itself", () => {
    expect(exerciseState({ dueDate: "2026-12-01" }, [{ key: "D", takes: [] }], "2026-12-02")).toMatchObject({
      kind: "overdue",
      label: "1 day overdue",
    });
    expect(exerciseState({ dueDate: "2026-12-02" }, [{ key: "D", takes: [] }], "2026-12-02")).toMatchObject({
      kind: "due",
      label: "Due today",
    });
  });

  it("without a due date it is simply to do, naming the keys left", () => {
    const s = exerciseState(
      { dueDate: null },
      [
        { key: "Eb", takes: [analysed] },
        { key: "Ab", takes: [] },
        { key: "Db", takes: [] },
      ],
      "2026-12-02",
      (k) => k.replace("b", "♭"),
    );
    expect(s).toMatchObject({
      kind: "open",
      label: "To do",
      keysDone: 1,
      keysTotal: 3,
      detail: "Takes in A♭, D♭ still to send.",
    });
  });

  it("orders overdue, then due by date, then undated, then done", () => {
    const at = (id: string, dueDate: string | null, takes: Array<{ status: string }>) => ({
      id,
      dueDate,
      state: exerciseState({ dueDate }, [{ key: "C", takes }], "2026-12-02"),
    });
    const list = [
      at("done", "2026-11-20", [analysed]),
      at("open", null, []),
      at("later", "2026-12-20", []),
      at("soon", "2026-12-03", []),
      at("late", "2026-11-30", []),
    ];
    expect(byState(list).map((e) => e.id)).toEqual(["late", "soon", "later", "open", "done"]);
  });

  it("counts days across month and year ends", () => {
    expect(dueWords("2027-01-02", "2026-12-31")).toBe("due in 2 days");
    expect(dueWords("2026-11-20", "2026-12-01")).toBe("11 days overdue");
  });
});
