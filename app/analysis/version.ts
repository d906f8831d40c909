// Raised whenever the results for the same take would change (stored beside each analysis).
// 2: the second edition reads harmonies, not strikes (RULES.md rules 15–23).
// 3: a target that ends on its first chord (I IV V I) is tried with enough loops for the whole take.
export const ANALYSIS_VERSION = 3;
