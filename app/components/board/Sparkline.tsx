/**
 * A small trend line drawn as plain SVG on the server (recharts only draws after
 * hydration, and the board should read at once). Gaps are weeks without takes.
 */
export function Sparkline({
  values,
  label,
  width = 96,
  height = 24,
}: {
  values: (number | null)[];
  label: string;
  width?: number;
  height?: number;
}) {
  const present = values.filter((v): v is number => v !== null);
  if (present.length === 0) {
    return (
      <span className="text-xs text-ink-soft" role="img" aria-label={`${label}: no takes`}>
        no takes
      </span>
    );
  }
  const lo = Math.min(...present);
  const hi = Math.max(...present);
  const span = hi - lo || 1;
  const step = values.length > 1 ? (width - 4) / (values.length - 1) : 0;
  const point = (v: number, i: number) => [2 + i * step, height - 3 - ((v - lo) / span) * (height - 6)] as const;
  // Split into runs so a silent week breaks the line instead of bridging it.
  const runs: string[] = [];
  let current: string[] = [];
  values.forEach((v, i) => {
    if (v === null) {
      if (current.length) runs.push(current.join(" "));
      current = [];
      return;
    }
    const [x, y] = point(v, i);
    current.push(`${current.length ? "L" : "M"}${x.toFixed(1)} ${y.toFixed(1)}`);
  });
  if (current.length) runs.push(current.join(" "));
  const lastIndex = values.map((v, i) => (v === null ? -1 : i)).reduce((a, b) => Math.max(a, b), -1);
  const [lx, ly] = point(values[lastIndex] as number, lastIndex);
  const first = present[0];
  const last = present[present.length - 1];
  return (
    <svg
      role="img"
      aria-label={`${label}: from ${first.toFixed(0)} to ${last.toFixed(0)}`}
      viewBox={`0 0 ${width} ${height}`}
      width={width}
      height={height}
      className="text-tide"
    >
      {runs.map((d, i) => (
        <path
          key={i}
          d={d}
          fill="none"
          stroke="currentColor"
          strokeWidth="1.5"
          strokeLinejoin="round"
          strokeLinecap="round"
        />
      ))}
      <circle cx={lx} cy={ly} r="2.2" fill="currentColor" />
    </svg>
  );
}
