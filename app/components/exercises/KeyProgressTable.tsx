import { Link } from "react-router";
import { pretty } from "~/utils/noteText";

type TakeCell = { id: string; status: string; score: number | null };
type Row = {
  id: string;
  name: string;
  done: boolean;
  progress: Array<{ key: string; takes: TakeCell[]; best: number | null }>;
};

/** One row per student (or just "You"), one column per key: takes sent and the best score so far. */
export function KeyProgressTable({ keys, rows }: { keys: string[]; rows: Row[] }) {
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No students are set this exercise.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <thead>
          <tr className="border-b border-line text-left text-ink-soft">
            <th scope="col" className="py-2 pr-4 font-semibold">
              Student
            </th>
            {keys.map((k) => (
              <th key={k} scope="col" className="py-2 pr-4 font-semibold">
                {pretty(k)}
              </th>
            ))}
            <th scope="col" className="py-2 font-semibold">
              State
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-line/60">
              <th scope="row" className="py-2 pr-4 text-left font-normal">
                {r.name}
              </th>
              {r.progress.map((p) => (
                <td key={p.key} className="py-2 pr-4 align-top">
                  {p.takes.length === 0 ? (
                    <span className="text-ink-soft">–</span>
                  ) : (
                    <span className="flex flex-col">
                      <span>
                        best <strong>{p.best ?? "–"}</strong>
                      </span>
                      <span className="flex flex-wrap gap-1 text-xs">
                        {p.takes.slice(0, 4).map((t, i) => (
                          <Link
                            key={t.id}
                            to={`/takes/${t.id}`}
                            className="text-tide-dark underline-offset-2 hover:underline"
                          >
                            {i === 0 ? "latest" : `#${p.takes.length - i}`}
                            {t.score !== null ? ` (${Math.round(t.score)})` : t.status === "failed" ? " (failed)" : ""}
                          </Link>
                        ))}
                      </span>
                    </span>
                  )}
                </td>
              ))}
              <td className="py-2">
                {r.done ? (
                  <span className="rounded bg-moss-pale px-2 py-0.5 text-moss">done</span>
                ) : (
                  <span className="rounded bg-ochre-pale px-2 py-0.5 text-ink">to do</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
