import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";

type Saved = { id: string; summary: string; createdAt: string } | null;
type SavedReport = { id: string; fromDate: string; toDate: string; createdAt: string; author: string | null };

/** The teacher's side of the report: write and save the summary, print, reopen earlier reports. */
export function ReportControls({
  studentId,
  from,
  to,
  saved,
  savedReports,
  errors,
  pending,
}: {
  studentId: string;
  from: string;
  to: string;
  saved: Saved;
  savedReports: SavedReport[];
  errors?: Record<string, string>;
  pending: boolean;
}) {
  const summaryError = errors?.summary ?? errors?.to ?? errors?.from;
  return (
    <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
      <Card title="Your summary">
        <Form method="post" className="flex flex-col gap-3">
          <input type="hidden" name="intent" value="save" />
          <input type="hidden" name="from" value={from} />
          <input type="hidden" name="to" value={to} />
          <label htmlFor="report-summary" className="text-sm text-ink-soft">
            A few sentences for the student, their parents or their school: what went well, what to work on next. It is
            printed under the figures.
          </label>
          <textarea
            id="report-summary"
            name="summary"
            rows={5}
            maxLength={5000}
            key={saved?.id ?? "new"}
            defaultValue={saved?.summary ?? ""}
            aria-invalid={summaryError ? true : undefined}
            aria-describedby={summaryError ? "report-summary-error" : undefined}
            className={`rounded-md border bg-white px-3 py-2 text-base shadow-inner outline-none focus:border-tide ${summaryError ? "border-brick" : "border-line"}`}
          />
          {summaryError ? (
            <p id="report-summary-error" role="alert" className="text-sm text-brick">
              {summaryError}
            </p>
          ) : null}
          <div className="flex flex-wrap gap-2">
            <Button pending={pending} pendingLabel="Saving…">
              {saved ? "Save as a new version" : "Save report"}
            </Button>
            <button
              type="button"
              onClick={() => window.print()}
              className="rounded-md border border-line bg-card px-4 py-2 text-sm font-semibold hover:border-tide"
            >
              Print or save as PDF
            </button>
          </div>
        </Form>
      </Card>
      <Card title="Saved reports">
        {savedReports.length === 0 ? (
          <p className="text-sm text-ink-soft">None yet. Saved reports can be reopened and printed again later.</p>
        ) : (
          <ul className="flex flex-col gap-1 text-sm">
            {savedReports.map((r) => (
              <li key={r.id}>
                <Link
                  to={`/reports/${studentId}?report=${r.id}`}
                  className={`hover:underline ${saved?.id === r.id ? "font-semibold text-ink" : "text-tide-dark"}`}
                >
                  {r.fromDate} to {r.toDate}
                </Link>{" "}
                <span className="text-xs text-ink-soft">
                  saved {r.createdAt.slice(0, 10)}
                  {r.author ? ` by ${r.author}` : ""}
                </span>
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}
