// The engine's typed error: a code, a one-line message for the student, and a name that says
// what it is (so a log line or `String(error)` reads "AnalysisError: ...").
import { describe, expect, it } from "vitest";
import { AnalysisError } from "../../../app/analysis/errors";

describe("AnalysisError", () => {
  it("carries its code, its own message when one is given, and its name", () => {
    const e = new AnalysisError("corrupt", "Track 2 ends inside a note.");
    expect(e).toBeInstanceOf(Error);
    expect(e.code).toBe("corrupt");
    expect(e.message).toBe("Track 2 ends inside a note.");
    expect(e.name).toBe("AnalysisError");
    expect(String(e)).toBe("AnalysisError: Track 2 ends inside a note.");
  });

  it("falls back to the code's one-line message", () => {
    const e = new AnalysisError("not-midi");
    expect(e.message).toMatch(/^This is not a MIDI file/);
    expect(new AnalysisError("too-long").message).toMatch(/30 minutes/);
  });
});
