// Weekly figures of the progress board, derived from sums. Pure: the server, the
// CSV export, the browser (formatting) and the tests share it. Every ratio is a
// ratio of sums (RULES.md: smoothness is never a mean of per-take ratios), so
// sums of several weeks or exercises combine exactly before dividing.
import { TECHNIQUES, type TechniqueName } from "~/analysis/types";
import { isoWeekOfDate, weekStart } from "./weeks";

/** What one student's takes of one week add up to (failed takes count in `takes` only). */
export type WeekSums = {
  takes: number;
  analysed: number;
  durationSec: number;
  changes: number;
  totalMotion: number;
  bestTotalMotion: number;
  leaps: number;
  scoreSum: number;
  accuracySum: number;
  /** Analysed takes recorded against an exercise: the ones accuracy is a mean over. */
  accuracyTakes: number;
  techniques: Partial<Record<TechniqueName, number>>;
};

export type Figures = {
  takes: number;
  practiceMinutes: number;
  changes: number;
  motionPerChange: number | null;
  smoothness: number | null;
  leapsPer10: number | null;
  accuracy: number | null;
  score: number | null;
  techniques: Record<TechniqueName, number>;
};

export const EMPTY_SUMS: WeekSums = {
  takes: 0,
  analysed: 0,
  durationSec: 0,
  changes: 0,
  totalMotion: 0,
  bestTotalMotion: 0,
  leaps: 0,
  scoreSum: 0,
  accuracySum: 0,
  accuracyTakes: 0,
  techniques: {},
};

export function combineSums(list: WeekSums[]): WeekSums {
  const out: WeekSums = { ...EMPTY_SUMS, techniques: {} };
  for (const s of list) {
    out.takes += s.takes;
    out.analysed += s.analysed;
    out.durationSec += s.durationSec;
    out.changes += s.changes;
    out.totalMotion += s.totalMotion;
    out.bestTotalMotion += s.bestTotalMotion;
    out.leaps += s.leaps;
    out.scoreSum += s.scoreSum;
    out.accuracySum += s.accuracySum;
    out.accuracyTakes += s.accuracyTakes;
    for (const [name, n] of Object.entries(s.techniques) as [TechniqueName, number][]) {
      out.techniques[name] = (out.techniques[name] ?? 0) + n;
    }
  }
  return out;
}

export function figuresFrom(s: WeekSums): Figures {
  const techniques = Object.fromEntries(TECHNIQUES.map((t) => [t, s.techniques[t] ?? 0])) as Record<
    TechniqueName,
    number
  >;
  return {
    takes: s.takes,
    practiceMinutes: s.durationSec / 60,
    changes: s.changes,
    motionPerChange: s.changes > 0 ? s.totalMotion / s.changes : null,
    // Nothing analysed: nothing to say. Analysed but nothing moved: perfectly smooth (RULES.md).
    smoothness: s.analysed === 0 ? null : s.totalMotion === 0 ? 1 : s.bestTotalMotion / s.totalMotion,
    leapsPer10: s.changes > 0 ? (10 * s.leaps) / s.changes : null,
    accuracy: s.accuracyTakes > 0 ? s.accuracySum / s.accuracyTakes : null,
    score: s.analysed > 0 ? s.scoreSum / s.analysed : null,
    techniques,
  };
}

export const METRIC_IDS = [
  "score",
  "smoothness",
  "motionPerChange",
  "leapsPer10",
  "accuracy",
  "practiceMinutes",
  "takes",
  "changes",
] as const;
export type MetricId = (typeof METRIC_IDS)[number];

type MetricInfo = { label: string; short: string; higherIsBetter: boolean; format: (v: number) => string };

export const METRICS: Record<MetricId, MetricInfo> = {
  score: { label: "Mean score", short: "Score", higherIsBetter: true, format: (v) => v.toFixed(0) },
  smoothness: { label: "Smoothness", short: "Smooth", higherIsBetter: true, format: (v) => `${Math.round(v * 100)}%` },
  motionPerChange: {
    label: "Motion per change (semitones)",
    short: "Motion",
    higherIsBetter: false,
    format: (v) => v.toFixed(1),
  },
  leapsPer10: {
    label: "Root-position leaps per 10 changes",
    short: "Leaps/10",
    higherIsBetter: false,
    format: (v) => v.toFixed(1),
  },
  accuracy: {
    label: "Accuracy on exercises",
    short: "Accuracy",
    higherIsBetter: true,
    format: (v) => `${Math.round(v * 100)}%`,
  },
  practiceMinutes: {
    label: "Practice minutes",
    short: "Minutes",
    higherIsBetter: true,
    format: (v) => (v < 10 ? v.toFixed(1) : v.toFixed(0)),
  },
  takes: { label: "Takes", short: "Takes", higherIsBetter: true, format: (v) => v.toFixed(0) },
  changes: { label: "Chord changes", short: "Changes", higherIsBetter: true, format: (v) => v.toFixed(0) },
};

export function metricValue(f: Figures, metric: MetricId): number | null {
  return f[metric];
}

export function formatMetric(metric: MetricId, v: number | null): string {
  return v === null ? "–" : METRICS[metric].format(v);
}

// --- Weeks --------------------------------------------------------------------

const WEEK_KEY = /^(\d{4})-W(\d{2})$/;

function keyOf(year: number, week: number) {
  return `${year}-W${String(week).padStart(2, "0")}`;
}

/** The ISO week a calendar date (YYYY-MM-DD, in the studio's calendar) falls in. */
export function weekOfDate(isoDate: string): string {
  const [y, m, d] = isoDate.split("-").map(Number);
  const w = isoWeekOfDate(y, m, d);
  return keyOf(w.year, w.week);
}

/** The week `n` weeks after `key` (n may be negative). */
export function shiftWeek(key: string, n: number): string {
  if (!WEEK_KEY.test(key)) throw new Error(`Not a week key: ${key}`);
  const monday = new Date(`${weekStart(key)}T00:00:00Z`);
  monday.setUTCDate(monday.getUTCDate() + 7 * n);
  return weekOfDate(monday.toISOString().slice(0, 10));
}

/** Every week key from `from` to `to`, both included (ISO week keys sort as text). */
export function weeksBetween(from: string, to: string, limit = 520): string[] {
  const out: string[] = [];
  for (let k = from; k <= to && out.length < limit; k = shiftWeek(k, 1)) out.push(k);
  return out;
}

// Built once: the same as toLocaleDateString("en-GB", these options) without a new formatter per call.
const WEEK_LABEL = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", timeZone: "UTC" });

/** "2026-W48" → "24 Nov": the Monday a week starts on, for axis labels. */
export function weekLabel(key: string): string {
  return WEEK_LABEL.format(new Date(`${weekStart(key)}T00:00:00Z`));
}

/** The Sunday a week ends on (YYYY-MM-DD). */
export function weekEnd(key: string): string {
  const d = new Date(`${weekStart(key)}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 6);
  return d.toISOString().slice(0, 10);
}
