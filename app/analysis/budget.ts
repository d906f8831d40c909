// A work budget for one whole take. The voicing searches (RULES.md rule 8) are the only part
// of the engine whose cost grows faster than the number of notes, and a crafted file within
// the upload limits could keep them busy for an hour. Every search spends from one budget per
// take, counted in search steps rather than wall time so that the same file always gets the
// same answer whatever else the machine is doing; when it runs out the take is refused as
// too complex to grade.
import { AnalysisError } from "./errors";

/**
 * Steps one take may spend. A step is one candidate note placed by the voicing search (one
 * column of rule 7's dynamic programme, at most eight additions); a chord-flag check of a
 * finished candidate counts 8 and the rest of grading a change 100 (grade.ts). On the
 * project's 2-core machine the worst case (random eight-note chords) runs at 700 to 1,400
 * steps per millisecond. Segmentation spends from it too (4 steps a span scored, 300 a chord
 * named for the first time; RULES.md, rule 15's implementation), so the worst file is refused
 * in about a second on a quiet machine, leaving room for reading it inside the 2-second aim.
 * Real takes spend far less: a change between four- or five-note voicings costs 100 to 150
 * steps, so several thousand distinct changes fit; a 10-minute take spends about 150,000.
 */
export const TAKE_BUDGET_STEPS = 1_000_000;

/** What a single search may spend when its caller gives no budget: a hang guard for tools and tests. */
export const CALL_BUDGET_STEPS = 1_000_000;

export class Budget {
  private left: number;
  private spentSoFar = 0;

  constructor(readonly steps: number = TAKE_BUDGET_STEPS) {
    if (!(steps >= 0)) throw new RangeError("a budget needs a non-negative number of steps");
    this.left = steps;
  }

  /** Spends n steps; throws AnalysisError("too-complex") once more than the budget is spent. */
  spend(n = 1): void {
    this.left -= n;
    this.spentSoFar += n;
    if (this.left < 0) throw new AnalysisError("too-complex");
  }

  /** Steps spent so far (for benchmarks and tests). */
  get spent(): number {
    return this.spentSoFar;
  }

  get remaining(): number {
    return Math.max(0, this.left);
  }
}
