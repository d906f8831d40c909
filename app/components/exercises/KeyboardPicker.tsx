import { noteName } from "~/analysis/pitch";
import { pretty } from "~/utils/noteText";

const WHITE_W = 16;
const WHITE_H = 64;
const BLACK_W = 10;
const BLACK_H = 40;
const BLACK_PCS = new Set([1, 3, 6, 8, 10]);
const isBlack = (m: number) => BLACK_PCS.has(((m % 12) + 12) % 12);

/**
 * A small keyboard from `low` to `high`. With `onToggle` every key is a button the teacher
 * presses to build a voicing; without it the keyboard only shows `notes`.
 */
export function KeyboardPicker({
  notes,
  low,
  high,
  label,
  onToggle,
}: {
  notes: readonly number[];
  low: number;
  high: number;
  label: string;
  onToggle?: (midi: number) => void;
}) {
  const whites: number[] = [];
  for (let m = low; m <= high; m++) if (!isBlack(m)) whites.push(m);
  const x = new Map(whites.map((m, i) => [m, i * WHITE_W]));
  const on = new Set(notes);
  const width = whites.length * WHITE_W + 1;
  const blacks: number[] = [];
  for (let m = low; m <= high; m++) if (isBlack(m) && x.has(m - 1)) blacks.push(m);
  const keyProps = (m: number) =>
    onToggle
      ? {
          role: "button",
          tabIndex: 0,
          "aria-pressed": on.has(m),
          "aria-label": pretty(noteName(m, null)),
          onClick: () => onToggle(m),
          onKeyDown: (e: React.KeyboardEvent) => {
            if (e.key === "Enter" || e.key === " ") {
              e.preventDefault();
              onToggle(m);
            }
          },
          className: "cursor-pointer focus:outline-none",
        }
      : {};
  return (
    <svg
      role={onToggle ? "group" : "img"}
      aria-label={label}
      viewBox={`0 0 ${width} ${WHITE_H + 1}`}
      width={width}
      height={WHITE_H + 1}
      className="max-w-full"
    >
      {whites.map((m) => (
        <g key={m} {...keyProps(m)} data-midi={m}>
          <rect
            x={x.get(m)! + 0.5}
            y={0.5}
            width={WHITE_W}
            height={WHITE_H}
            rx={2}
            className={on.has(m) ? "fill-tide" : "fill-white"}
            stroke="var(--color-line)"
          />
          {m % 12 === 0 ? (
            <text
              x={x.get(m)! + WHITE_W / 2 + 0.5}
              y={WHITE_H - 4}
              textAnchor="middle"
              className={`text-xs ${on.has(m) ? "fill-white" : "fill-ink-soft"}`}
            >
              C{Math.floor(m / 12) - 1}
            </text>
          ) : null}
        </g>
      ))}
      {blacks.map((m) => (
        <g key={m} {...keyProps(m)} data-midi={m}>
          <rect
            x={x.get(m - 1)! + WHITE_W - BLACK_W / 2 + 0.5}
            y={0.5}
            width={BLACK_W}
            height={BLACK_H}
            rx={1.5}
            className={on.has(m) ? "fill-tide" : "fill-ink"}
          />
        </g>
      ))}
    </svg>
  );
}
