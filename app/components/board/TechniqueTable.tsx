import { TECHNIQUES, type TechniqueName } from "~/analysis/types";
import { TECHNIQUE_WORDS } from "~/takes/takeWords";

/** How often each technique appeared in the period, and in how many of its weeks. */
export function TechniqueTable({
  totals,
  weeksUsed,
  weekCount,
  gained = [],
}: {
  totals: Record<TechniqueName, number>;
  weeksUsed: Record<TechniqueName, number>;
  weekCount: number;
  gained?: TechniqueName[];
}) {
  return (
    <table className="w-full border-collapse text-left text-sm">
      <caption className="sr-only">Techniques used in the period</caption>
      <thead className="text-xs uppercase tracking-wide text-ink-soft">
        <tr>
          <th scope="col" className="py-1.5 pr-3">
            Technique
          </th>
          <th scope="col" className="px-3 py-1.5 text-right">
            Times
          </th>
          <th scope="col" className="px-3 py-1.5 text-right">
            Weeks used
          </th>
        </tr>
      </thead>
      <tbody className="divide-y divide-line">
        {TECHNIQUES.map((t) => (
          <tr key={t}>
            <th scope="row" className="py-1.5 pr-3 font-normal">
              <span className="font-semibold">{TECHNIQUE_WORDS[t].label}</span>
              {gained.includes(t) ? (
                <span className="ml-2 rounded-full bg-moss-pale px-2 py-0.5 text-xs font-semibold text-moss">new</span>
              ) : null}
              <span className="block text-xs text-ink-soft">{TECHNIQUE_WORDS[t].text}</span>
            </th>
            <td className="px-3 py-1.5 text-right tabular-nums">{totals[t]}</td>
            <td className="px-3 py-1.5 text-right tabular-nums">
              {weeksUsed[t]} of {weekCount}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
