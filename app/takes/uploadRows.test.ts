import { describe, expect, it } from "vitest";
import { formatBytes, isFinished, newRow, precheck, rowFromAnswer } from "./uploadRows";

const summary = { chordCount: 12, smoothness: 0.75, score: 68 } as never;

describe("upload rows", () => {
  it("refuses other extensions, empty files and files over 2 MiB (2,097,152 bytes) before sending", () => {
    expect(precheck({ name: "take.mid", size: 100 })).toBeNull();
    expect(precheck({ name: "TAKE.MIDI", size: 100 })).toBeNull();
    expect(precheck({ name: "take.mp3", size: 100 })).toMatch(/Only MIDI files/);
    expect(precheck({ name: "take.mid", size: 2_097_152 })).toBeNull();
    expect(precheck({ name: "take.mid", size: 2_097_153 })).toMatch(/over 2 MiB/);
    expect(precheck({ name: "take.mid", size: 0 })).toMatch(/empty/);
    expect(newRow("a", { name: "x.wav", size: 10 }).stage).toBe("refused");
    expect(newRow("a", { name: "x.mid", size: 10 }).stage).toBe("ready");
  });

  it("201 shows the figures and links the new take", () => {
    const row = rowFromAnswer(newRow("a", { name: "x.mid", size: 10 }), 201, {
      id: "t1",
      status: "analysed",
      analysis: { summary },
    });
    expect(row).toMatchObject({
      stage: "analysed",
      takeId: "t1",
      chordCount: 12,
      smoothness: 0.75,
      score: 68,
      error: null,
    });
    expect(isFinished(row)).toBe(true);
  });

  it("422 keeps the link to the stored failed take with the engine's message", () => {
    const row = rowFromAnswer(newRow("a", { name: "x.mid", size: 10 }), 422, {
      id: "t2",
      status: "failed",
      error: "cut short",
    });
    expect(row).toMatchObject({ stage: "failed", takeId: "t2", error: "cut short" });
  });

  it("409 links the take uploaded before", () => {
    const row = rowFromAnswer(newRow("a", { name: "x.mid", size: 10 }), 409, {
      id: "t0",
      error: "You have uploaded this take already.",
    });
    expect(row).toMatchObject({ stage: "duplicate", takeId: "t0" });
  });

  it("413, 415 and network failures are refusals without a link", () => {
    for (const status of [413, 415, 0, 500]) {
      const row = rowFromAnswer(newRow("a", { name: "x.mid", size: 10 }), status, null);
      expect(row.stage).toBe("refused");
      expect(row.takeId).toBeNull();
      expect(row.error).toBeTruthy();
    }
    expect(rowFromAnswer(newRow("a", { name: "x.mid", size: 10 }), 415, { error: "Not MIDI." }).error).toBe(
      "Not MIDI.",
    );
  });

  it("a row is unfinished while ready, uploading or analysing", () => {
    const row = newRow("a", { name: "x.mid", size: 10 });
    expect(isFinished(row)).toBe(false);
    expect(isFinished({ ...row, stage: "analysing" })).toBe(false);
  });

  it("formats sizes", () => {
    expect([formatBytes(512), formatBytes(2048), formatBytes(3 * 1024 * 1024)]).toEqual(["512 B", "2.0 KB", "3.00 MB"]);
  });
});
