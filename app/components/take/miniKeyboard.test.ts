import { describe, expect, it } from "vitest";
import { keyboardRange } from "./MiniKeyboard";

describe("mini keyboard range", () => {
  it("runs from the C at or below the lowest note to the B at or above the highest (middle C = 60)", () => {
    expect(keyboardRange([62, 66, 69])).toEqual({ low: 60, high: 71 });
    expect(keyboardRange([53, 58, 62, 74])).toEqual({ low: 48, high: 83 });
    expect(keyboardRange([60])).toEqual({ low: 60, high: 71 });
    expect(keyboardRange([])).toEqual({ low: 60, high: 71 });
  });
});
