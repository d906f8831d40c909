// Dates and times in the studio's own time zone, spelled the same way on the
// server and in the browser (built from Intl's parts, so no locale default and
// no local zone of the machine slips in and breaks hydration).

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", {
      timeZone,
      year: "numeric",
      month: "short",
      day: "numeric",
      hour: "2-digit",
      minute: "2-digit",
      hourCycle: "h23",
      weekday: "short",
    });
    formatters.set(timeZone, f);
  }
  return f;
}

function parts(iso: string | Date, timeZone: string) {
  const d = typeof iso === "string" ? new Date(iso) : iso;
  if (Number.isNaN(d.getTime())) return null;
  const got = Object.fromEntries(
    formatter(timeZone)
      .formatToParts(d)
      .map((p) => [p.type, p.value]),
  );
  return { weekday: got.weekday, day: got.day, month: got.month, year: got.year, hour: got.hour, minute: got.minute };
}

/** "2 Dec 2026, 13:05" in the studio's zone. */
export function studioDateTime(iso: string | Date, timeZone: string): string {
  const p = parts(iso, timeZone);
  return p ? `${p.day} ${p.month} ${p.year}, ${p.hour}:${p.minute}` : "–";
}

/** "Wed 2 Dec" in the studio's zone: short enough for a table cell that must not wrap. */
export function studioShortDate(iso: string | Date, timeZone: string): string {
  const p = parts(iso, timeZone);
  return p ? `${p.weekday} ${p.day} ${p.month}` : "–";
}

/** "13:05" in the studio's zone. */
export function studioClock(iso: string | Date, timeZone: string): string {
  const p = parts(iso, timeZone);
  return p ? `${p.hour}:${p.minute}` : "–";
}

/** "New York" from "America/New_York": how the zone is named next to times. */
export function zoneName(timeZone: string): string {
  return timeZone === "UTC" ? "UTC" : (timeZone.split("/").at(-1) ?? timeZone).replaceAll("_", " ");
}
