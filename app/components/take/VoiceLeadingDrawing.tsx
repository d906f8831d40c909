import type { Key } from "~/analysis/pitch";
import { noteLabel } from "~/utils/noteText";
import { signedSemitones, voiceDrawing } from "~/takes/voiceLeadingDrawing";

const WIDTH = 220;

/** Colour of a voice's move: held, a step, a third, further. */
function moveTone(semitones: number): string {
  const d = Math.abs(semitones);
  return d === 0 ? "stroke-moss" : d <= 2 ? "stroke-tide" : d <= 4 ? "stroke-ochre" : "stroke-brick";
}

/**
 * One change drawn as voice leading: the first voicing's notes on the left, the second's on
 * the right, a line from every note to the note it moves to, labelled with its semitones.
 * `range` keeps drawings of the same change on one pitch scale.
 */
export function VoiceLeadingDrawing({
  from,
  to,
  fromName,
  toName,
  keyInfo,
  range,
  label,
}: {
  from: number[];
  to: number[];
  fromName: string;
  toName: string;
  keyInfo: Key | null;
  range: { lo: number; hi: number };
  label: string;
}) {
  const d = voiceDrawing(from, to, { width: WIDTH, range, rowPx: 7, labelGap: 18 });
  const top = 22;
  const total = d.lines.reduce((s, l) => s + Math.abs(l.semitones), 0);
  return (
    <svg
      width={WIDTH}
      height={d.height + top}
      role="img"
      aria-label={`${label}: ${d.lines.map((l) => `${noteLabel(l.from, keyInfo)} to ${noteLabel(l.to, keyInfo)} ${signedSemitones(l.semitones)}`).join(", ")}; ${total} semitones in all`}
      className="max-w-full overflow-visible"
      data-testid="voice-leading"
    >
      <text x={d.left} y={14} textAnchor="middle" className="fill-ink text-[13px] font-semibold">
        {fromName}
      </text>
      <text x={d.right} y={14} textAnchor="middle" className="fill-ink text-[13px] font-semibold">
        {toName}
      </text>
      <g transform={`translate(0 ${top})`}>
        <line x1={d.left} x2={d.left} y1={4} y2={d.height - 4} className="stroke-line" />
        <line x1={d.right} x2={d.right} y1={4} y2={d.height - 4} className="stroke-line" />
        {d.lines.map((l, i) => (
          <line
            key={i}
            x1={d.left}
            y1={l.y1}
            x2={d.right}
            y2={l.y2}
            className={moveTone(l.semitones)}
            strokeWidth={2.5}
            strokeLinecap="round"
          />
        ))}
        {d.lines.map((l, i) => {
          const text = signedSemitones(l.semitones);
          const w = 8 * text.length + 8;
          const x = (d.left + d.right) / 2;
          return (
            <g key={`t${i}`}>
              <rect x={x - w / 2} y={l.labelY - 8} width={w} height={16} rx={3} className="fill-white stroke-line" />
              <text x={x} y={l.labelY + 4} textAnchor="middle" className="fill-ink text-[12px] font-semibold">
                {text}
              </text>
            </g>
          );
        })}
        {d.fromNotes.map((n) => (
          <g key={`f${n.midi}`}>
            <circle cx={d.left} cy={n.y} r={4} className="fill-ink" />
            <text x={d.left - 8} y={n.labelY + 4} textAnchor="end" className="fill-ink-soft text-[12px]">
              {noteLabel(n.midi, keyInfo)}
            </text>
          </g>
        ))}
        {d.toNotes.map((n) => (
          <g key={`t${n.midi}`}>
            <circle cx={d.right} cy={n.y} r={4} className="fill-ink" />
            <text x={d.right + 8} y={n.labelY + 4} className="fill-ink-soft text-[12px]">
              {noteLabel(n.midi, keyInfo)}
            </text>
          </g>
        ))}
      </g>
    </svg>
  );
}
