// Raised whenever the results for the same take would change (stored beside each analysis).
// 2: the second edition reads harmonies, not strikes (RULES.md rules 15–23).
export const ANALYSIS_VERSION = 2;
