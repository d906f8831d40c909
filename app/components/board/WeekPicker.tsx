import { Form, useSearchParams, useSubmit } from "react-router";

/** Which week the table shows; a plain GET form so the address keeps it (and the chart's choice). */
export function WeekPicker({ week, options }: { week: string; options: { key: string; label: string }[] }) {
  const [params] = useSearchParams();
  const submit = useSubmit();
  // The chart writes its choice into the address itself; read it from there, not from the router's copy.
  const chartParams = () =>
    [...new URLSearchParams(typeof window === "undefined" ? params : window.location.search)].filter(
      ([k]) => k !== "week",
    );
  return (
    <Form
      method="get"
      className="no-print flex items-end gap-2"
      onChange={(e) => {
        const form = new FormData(e.currentTarget);
        const next = new URLSearchParams(chartParams());
        next.set("week", String(form.get("week")));
        submit(next, { method: "get", preventScrollReset: true });
      }}
    >
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Week shown in the table
        <select
          name="week"
          defaultValue={week}
          key={week}
          className="rounded-md border border-line bg-white px-3 py-1.5 font-normal"
        >
          {options.map((o) => (
            <option key={o.key} value={o.key}>
              {o.label} ({o.key})
            </option>
          ))}
        </select>
      </label>
      <noscript>
        <button type="submit" className="rounded-md border border-line px-3 py-1.5 text-sm">
          Show
        </button>
      </noscript>
    </Form>
  );
}
