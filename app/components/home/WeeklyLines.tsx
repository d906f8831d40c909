import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export type WeekPoint = { week: string; smoothness: number | null; score: number | null };

/**
 * The weekly chart proper (recharts); loaded on its own once the home page is in the browser.
 * Straight segments, a gap for a week without takes, and a dash as well as a colour per line.
 */
export default function WeeklyLines({ points }: { points: WeekPoint[] }) {
  return (
    <ResponsiveContainer width="100%" height="100%">
      <LineChart data={points} margin={{ top: 8, right: 16, bottom: 0, left: -16 }}>
        <CartesianGrid stroke="var(--color-line)" strokeDasharray="3 3" />
        <XAxis dataKey="week" tick={{ fill: "var(--color-ink-soft)", fontSize: 12 }} />
        <YAxis domain={[0, 100]} tick={{ fill: "var(--color-ink-soft)", fontSize: 12 }} />
        <Tooltip
          contentStyle={{ background: "var(--color-card)", border: "1px solid var(--color-line)", borderRadius: 6 }}
        />
        <Legend />
        <Line
          type="linear"
          dataKey="smoothness"
          name="Smoothness %"
          stroke="var(--color-tide)"
          strokeWidth={2.5}
          connectNulls={false}
          isAnimationActive={false}
        />
        <Line
          type="linear"
          dataKey="score"
          name="Average score"
          stroke="var(--color-ochre)"
          strokeDasharray="6 3"
          strokeWidth={2.5}
          connectNulls={false}
          isAnimationActive={false}
        />
      </LineChart>
    </ResponsiveContainer>
  );
}
