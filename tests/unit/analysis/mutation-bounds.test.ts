// Exact bounds a mutation run found unpinned: an interval of exactly 0.1 s for steady time,
// a top line of one change, and low-interval checks that must not reorder the caller's notes.
// Each expected value is worked by hand from the rule named beside it.
import { describe, expect, it } from "vitest";
import { isMuddyLowInterval } from "../../../app/analysis/lowInterval";
import { smoothTopLineShare } from "../../../app/analysis/techniques";
import { commonestInterval } from "../../../app/analysis/tempo";

describe("exact bounds", () => {
  it("an interval of 0.1 s, half the shortest beat (300 bpm), still counts towards a beat (rule 22)", () => {
    expect(commonestInterval([0.1])).toBe(0.1);
    expect(commonestInterval([0.099])).toBeNull();
  });

  it("two top notes are one change: its share is 0 or 1 (rule 13)", () => {
    expect(smoothTopLineShare([67, 69])).toBe(1);
    expect(smoothTopLineShare([67, 70])).toBe(0);
  });

  it("the low-interval check leaves the caller's voicing as it was (rule 12)", () => {
    const v = [67, 40, 44];
    expect(isMuddyLowInterval(v)).toBe(true);
    expect(v).toEqual([67, 40, 44]);
  });
});
