// Raised whenever the results for the same take would change (stored beside each analysis).
export const ANALYSIS_VERSION = 1;
