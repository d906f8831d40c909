// Exact bounds a mutation run found unpinned: an interval of exactly 0.1 s for steady time,
// a top line of one change, and low-interval checks that must not reorder the caller's notes.
// Each expected value is worked by hand from the rule named beside it.
import { describe, expect, it } from "vitest";
import { isRootPositionLeap } from "../../../app/analysis/changeFlags";
import { isMuddyLowInterval } from "../../../app/analysis/lowInterval";
import { smoothTopLineShare } from "../../../app/analysis/techniques";
import { commonestInterval } from "../../../app/analysis/tempo";

describe("exact bounds", () => {
  it("an interval of 0.1 s, half the shortest beat (300 bpm), still counts towards a beat (rule 22)", () => {
    expect(commonestInterval([0.1])).toBe(0.1);
    expect(commonestInterval([0.099])).toBeNull();
  });

  it("the cluster with the most intervals wins, even when it lies after a denser start (rule 22)", () => {
    // By hand: 0.2 alone, 0.3 twice, 0.7 three times (each window 5% + 30 ms wide): 0.7.
    expect(commonestInterval([0.2, 0.3, 0.3, 0.7, 0.7, 0.7])).toBe(0.7);
  });

  it("two-hand voicings moving as one block, bass included, are judged whole without both roots (rule 9)", () => {
    // C2 + C4 E4 G4 → F2 + F4 A4 C5: every voice up 5, both in root position.
    const a = [36, 60, 64, 67];
    const b = [41, 65, 69, 72];
    expect(isRootPositionLeap(a, b, 0, 0)).toBe(true);
    expect(isRootPositionLeap(a, b, 0, 0, undefined, 5)).toBe(true);
    expect(isRootPositionLeap(a, b, 0, 0, 0, undefined)).toBe(true);
    expect(isRootPositionLeap(a, b, 0, 0, 0, 5)).toBe(true);
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
