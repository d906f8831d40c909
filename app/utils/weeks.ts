// ISO 8601 weeks in a studio's own time zone. Pure: used by the server and the tests.

// One formatter per time zone: building an Intl.DateTimeFormat costs far more than using one.
const dateFormats = new Map<string, Intl.DateTimeFormat>();

function dateFormat(timeZone: string): Intl.DateTimeFormat {
  let f = dateFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" });
    dateFormats.set(timeZone, f);
  }
  return f;
}

/** The calendar date (y, m, d) that `instant` falls on in `timeZone`. */
export function localDate(instant: Date, timeZone: string): { year: number; month: number; day: number } {
  const parts = dateFormat(timeZone).formatToParts(instant);
  const get = (type: string) => Number(parts.find((p) => p.type === type)!.value);
  return { year: get("year"), month: get("month"), day: get("day") };
}

/** ISO week of a calendar date: weeks start on Monday; week 1 holds the year's first Thursday. */
export function isoWeekOfDate(year: number, month: number, day: number): { year: number; week: number } {
  const date = new Date(Date.UTC(year, month - 1, day));
  const weekday = date.getUTCDay() || 7; // Monday 1 … Sunday 7
  date.setUTCDate(date.getUTCDate() + 4 - weekday); // the Thursday of this week decides the year
  const weekYear = date.getUTCFullYear();
  const firstDay = Date.UTC(weekYear, 0, 1);
  const week = Math.ceil(((date.getTime() - firstDay) / 86_400_000 + 1) / 7);
  return { year: weekYear, week };
}

export function weekKey(instant: Date, timeZone: string): string {
  const d = localDate(instant, timeZone);
  const w = isoWeekOfDate(d.year, d.month, d.day);
  return `${w.year}-W${String(w.week).padStart(2, "0")}`;
}

/** The Monday (YYYY-MM-DD) that starts an ISO week key. */
export function weekStart(key: string): string {
  const m = /^(\d{4})-W(\d{2})$/.exec(key);
  if (!m) throw new Error(`Not a week key: ${key}`);
  const year = Number(m[1]);
  const jan4 = new Date(Date.UTC(year, 0, 4));
  const monday = new Date(jan4.getTime() - ((jan4.getUTCDay() || 7) - 1) * 86_400_000);
  monday.setUTCDate(monday.getUTCDate() + (Number(m[2]) - 1) * 7);
  return monday.toISOString().slice(0, 10);
}

export function isValidTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}
