import { isBlackKey } from "~/takes/pianoRoll";

const WHITE_W = 13;
const WHITE_H = 52;
const BLACK_W = 8;
const BLACK_H = 32;

/** Range shown: from the C at or below the lowest note to the B at or above the highest. */
export function keyboardRange(notes: readonly number[]): { low: number; high: number } {
  if (notes.length === 0) return { low: 60, high: 71 };
  const lo = Math.min(...notes);
  const hi = Math.max(...notes);
  return { low: lo - (((lo % 12) + 12) % 12), high: hi + (11 - (((hi % 12) + 12) % 12)) };
}

/**
 * A small drawn keyboard: `notes` filled in teal, `ghost` (the chord before) outlined in
 * ochre, so a student sees where each finger goes from and to.
 */
export function MiniKeyboard({
  notes,
  ghost = [],
  label,
  range,
}: {
  notes: readonly number[];
  ghost?: readonly number[];
  label: string;
  range?: { low: number; high: number };
}) {
  const { low, high } = range ?? keyboardRange([...notes, ...ghost]);
  const whites: number[] = [];
  for (let m = low; m <= high; m++) if (!isBlackKey(m)) whites.push(m);
  const xOfWhite = new Map(whites.map((m, i) => [m, i * WHITE_W]));
  const on = new Set(notes);
  const before = new Set(ghost);
  const width = whites.length * WHITE_W + 1;
  const blacks: number[] = [];
  for (let m = low; m <= high; m++) if (isBlackKey(m)) blacks.push(m);
  return (
    <svg
      role="img"
      aria-label={label}
      viewBox={`0 0 ${width} ${WHITE_H + 1}`}
      width={width}
      height={WHITE_H + 1}
      className="max-w-full"
    >
      {whites.map((m) => (
        <rect
          key={m}
          x={xOfWhite.get(m)! + 0.5}
          y={0.5}
          width={WHITE_W}
          height={WHITE_H}
          rx={2}
          className={on.has(m) ? "fill-tide" : "fill-white"}
          stroke={before.has(m) ? "var(--color-ochre)" : "var(--color-line)"}
          strokeWidth={before.has(m) ? 2.5 : 1}
        />
      ))}
      {blacks.map((m) => {
        const left = xOfWhite.get(m - 1);
        if (left === undefined) return null;
        return (
          <rect
            key={m}
            x={left + WHITE_W - BLACK_W / 2 + 0.5}
            y={0.5}
            width={BLACK_W}
            height={BLACK_H}
            rx={1.5}
            className={on.has(m) ? "fill-tide" : "fill-ink"}
            stroke={before.has(m) ? "var(--color-ochre)" : "none"}
            strokeWidth={2.5}
          />
        );
      })}
      {[...on].map((m) => {
        const x = isBlackKey(m) ? xOfWhite.get(m - 1)! + WHITE_W + 0.5 : xOfWhite.get(m)! + WHITE_W / 2 + 0.5;
        const y = isBlackKey(m) ? BLACK_H - 6 : WHITE_H - 7;
        return xOfWhite.has(isBlackKey(m) ? m - 1 : m) ? (
          <circle key={`d${m}`} cx={x} cy={y} r={2.5} className="fill-white" />
        ) : null;
      })}
    </svg>
  );
}
