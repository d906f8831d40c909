import { useState } from "react";
import { Form, Link, useNavigation, useSearchParams, useSubmit } from "react-router";
import type { FlagName } from "~/analysis/types";
import { Button } from "~/components/Button";
import { EmptyState } from "~/components/EmptyState";
import { FlashMessage } from "~/components/FlashMessage";
import { FLAG_TITLES } from "~/takes/explainFlags";
import { pretty } from "~/utils/noteText";
import { studioClock, studioDateTime, studioShortDate } from "~/utils/studioTime";
import type { ListeningQuery, ListeningRow } from "~/models/listening.server";

type Props = {
  query: ListeningQuery;
  list: { rows: ListeningRow[]; total: number; page: number; pages: number; pageSize: number };
  filters: { students: { id: string; name: string }[]; exercises: { id: string; title: string }[] };
  timeZone: string;
  undo: string[];
  error?: string;
};

const SORT_LABELS: Record<ListeningQuery["sort"], string> = {
  newest: "Newest recorded first",
  oldest: "Oldest recorded first",
  arrived: "Latest to arrive first",
};

function flagList(flags: Record<string, number> | null) {
  if (!flags) return [];
  return Object.entries(flags)
    .filter(([, n]) => n > 0)
    .map(([f, n]) => `${FLAG_TITLES[f as FlagName] ?? f} ×${n}`);
}

/** The filters as a GET form: with scripts each change applies at once, without them the button does. */
function Filters({ query, filters }: Pick<Props, "query" | "filters">) {
  const submit = useSubmit();
  const select = "rounded-md border border-line bg-white px-3 py-1.5 font-normal";
  return (
    <Form
      method="get"
      role="search"
      aria-label="Filter the takes"
      className="flex flex-wrap items-end gap-3"
      onChange={(e) => {
        // Only the choices that narrow the list go into the address; a new choice starts at page 1.
        const params = new URLSearchParams();
        for (const [k, v] of new FormData(e.currentTarget)) if (typeof v === "string" && v) params.set(k, v);
        if (params.get("sort") === "newest") params.delete("sort");
        submit(params, { method: "get", replace: true, preventScrollReset: true });
      }}
    >
      <label className="flex min-w-40 flex-1 flex-col gap-1 text-sm font-semibold sm:flex-none">
        Student
        <select name="student" defaultValue={query.student ?? ""} className={select}>
          <option value="">Every student</option>
          {filters.students.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      <label className="flex min-w-40 flex-1 flex-col gap-1 text-sm font-semibold sm:flex-none">
        Exercise
        <select name="exercise" defaultValue={query.exercise ?? ""} className={select}>
          <option value="">Every exercise</option>
          <option value="free">Free practice</option>
          {filters.exercises.map((x) => (
            <option key={x.id} value={x.id}>
              {x.title}
            </option>
          ))}
        </select>
      </label>
      <label className="flex min-w-40 flex-1 flex-col gap-1 text-sm font-semibold sm:flex-none">
        Order
        <select name="sort" defaultValue={query.sort} className={select}>
          {Object.entries(SORT_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
      </label>
      <noscript>
        <Button variant="secondary">Show these takes</Button>
      </noscript>
    </Form>
  );
}

function Pager({ page, pages }: { page: number; pages: number }) {
  const [params] = useSearchParams();
  if (pages <= 1) return null;
  const href = (n: number) => {
    const next = new URLSearchParams(params);
    next.delete("undo");
    if (n === 1) next.delete("page");
    else next.set("page", String(n));
    return `?${next}`;
  };
  const link =
    "rounded-md border border-line bg-card px-3 py-1.5 text-sm font-semibold text-tide-dark hover:border-tide";
  return (
    <nav aria-label="Pages of the list" className="flex flex-wrap items-center justify-between gap-3">
      {page > 1 ? (
        <Link to={href(page - 1)} className={link} preventScrollReset={false}>
          ← Newer page
        </Link>
      ) : (
        <span />
      )}
      <span className="text-sm text-ink-soft">
        Page {page} of {pages}
      </span>
      {page < pages ? (
        <Link to={href(page + 1)} className={link}>
          Older page →
        </Link>
      ) : (
        <span />
      )}
    </nav>
  );
}

/**
 * The takes waiting to be heard, a page at a time: tick several and mark them
 * in one go, or mark one from its own row. The row's card layout on a phone
 * keeps the checkbox and the button in view.
 */
export function ListeningList({ query, list, filters, timeZone, undo, error }: Props) {
  const navigation = useNavigation();
  const [ticked, setTicked] = useState<string[]>([]);
  const busy = navigation.state === "submitting" && navigation.formData?.get("intent") === "review";
  const pageIds = list.rows.map((r) => r.id);
  const allTicked = pageIds.length > 0 && pageIds.every((id) => ticked.includes(id));
  const toggle = (id: string) => setTicked((t) => (t.includes(id) ? t.filter((x) => x !== id) : [...t, id]));
  const filtered = Boolean(query.student || query.exercise);
  const first = (list.page - 1) * list.pageSize + 1;

  return (
    <div className="flex flex-col gap-4">
      {undo.length ? (
        <Form
          method="post"
          className="flex flex-wrap items-center gap-3 rounded-md border border-line bg-card px-4 py-2 text-sm"
        >
          <span>{undo.length === 1 ? "One take" : `${undo.length} takes`} left the list.</span>
          <input type="hidden" name="intent" value="unreview" />
          {undo.map((id) => (
            <input key={id} type="hidden" name="takeId" value={id} />
          ))}
          <Button variant="quiet">Put {undo.length === 1 ? "it" : "them"} back on the list</Button>
        </Form>
      ) : null}
      <Filters query={query} filters={filters} />
      {error ? <FlashMessage tone="error">{error}</FlashMessage> : null}
      {list.total === 0 ? (
        <EmptyState title={filtered ? "Nothing to listen to for this choice" : "Nothing to listen to"}>
          {filtered
            ? "Every take for this student and exercise has been heard. Choose “Every student” or “Every exercise” to see the rest."
            : "New takes from your students appear here as they arrive."}
        </EmptyState>
      ) : (
        <Form method="post" className="flex flex-col gap-3" onSubmit={() => setTicked([])}>
          <input type="hidden" name="intent" value="review" />
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p className="text-sm text-ink-soft" data-testid="listening-count">
              {list.total} take{list.total === 1 ? "" : "s"} to listen to
              {list.pages > 1 ? ` · ${first}–${first + list.rows.length - 1} shown` : ""}
            </p>
            <Button
              variant="primary"
              disabled={ticked.length === 0}
              pending={busy && !navigation.formData?.get("only")}
              pendingLabel="Marking…"
            >
              {ticked.length ? `Mark ${ticked.length} as heard` : "Mark ticked takes as heard"}
            </Button>
          </div>
          <div className="rounded-lg border border-line bg-card">
            <table className="table-cards w-full border-collapse text-left text-sm" data-testid="review-queue">
              <caption className="sr-only">Takes to listen to, {SORT_LABELS[query.sort].toLowerCase()}</caption>
              <thead className="bg-paper text-xs uppercase tracking-wide text-ink-soft">
                <tr>
                  <th scope="col" className="w-10 px-3 py-2">
                    <input
                      type="checkbox"
                      aria-label="Tick every take on this page"
                      className="h-5 w-5"
                      checked={allTicked}
                      onChange={() => setTicked(allTicked ? [] : pageIds)}
                    />
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Recorded
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Student
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Exercise
                  </th>
                  <th scope="col" className="px-3 py-2 text-right">
                    Score
                  </th>
                  <th scope="col" className="px-3 py-2">
                    Flags
                  </th>
                  <th scope="col" className="px-3 py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {list.rows.map((t) => (
                  <tr key={t.id} className="align-top hover:bg-paper/60" data-testid="listening-row">
                    <td className="card-check px-3 py-2">
                      <input
                        type="checkbox"
                        name="takeId"
                        value={t.id}
                        checked={ticked.includes(t.id)}
                        onChange={() => toggle(t.id)}
                        aria-label={`Tick ${t.studentName}'s take of ${studioDateTime(t.recordedAt, timeZone)}`}
                        className="h-5 w-5"
                      />
                    </td>
                    <td className="whitespace-nowrap px-3 py-2" data-label="Recorded">
                      <time
                        dateTime={t.recordedAt}
                        title={`Arrived ${studioDateTime(t.createdAt, timeZone)}`}
                        className="whitespace-nowrap"
                      >
                        {studioShortDate(t.recordedAt, timeZone)}, {studioClock(t.recordedAt, timeZone)}
                      </time>
                    </td>
                    <td className="px-3 py-2 font-semibold" data-label="Student">
                      {t.studentName}
                    </td>
                    <td className="px-3 py-2" data-label="Exercise">
                      <Link to={`/takes/${t.id}`} className="text-tide-dark underline-offset-2 hover:underline">
                        {t.exerciseTitle ?? "Free practice"}
                        {t.key ? <span className="text-ink-soft"> · {pretty(t.key)}</span> : null}
                      </Link>
                    </td>
                    <td className="px-3 py-2 text-right tabular-nums" data-label="Score">
                      {t.score !== null ? Math.round(t.score) : t.status === "failed" ? "not analysed" : "–"}
                    </td>
                    <td className="px-3 py-2 text-xs" data-label="Flags">
                      {flagList(t.flags).join(", ") || <span className="text-ink-soft">none</span>}
                    </td>
                    <td className="px-3 py-2">
                      <Button
                        variant="secondary"
                        name="only"
                        value={t.id}
                        className="whitespace-nowrap"
                        pending={busy && navigation.formData?.get("only") === t.id}
                        pendingLabel="Marking…"
                      >
                        <span>
                          Mark<span className="sr-only"> {t.studentName}'s take</span> as heard
                        </span>
                      </Button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Form>
      )}
      <Pager page={list.page} pages={list.pages} />
    </div>
  );
}
