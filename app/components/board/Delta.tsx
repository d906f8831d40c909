import { formatMetric, METRICS, type MetricId } from "~/utils/progressFigures";

/**
 * This week's value with a marker for the change since last week: a filled
 * triangle pointing up or down, green when the change is good for this metric
 * and brick when it is not. The words are there for screen readers.
 */
export function Delta({ metric, now, before }: { metric: MetricId; now: number | null; before: number | null }) {
  const value = formatMetric(metric, now);
  if (now === null || before === null) return <span>{value}</span>;
  const diff = now - before;
  const tiny = Math.abs(diff) < (metric === "smoothness" || metric === "accuracy" ? 0.005 : 0.05);
  if (tiny) {
    return (
      <span>
        {value} <span className="sr-only">(same as last week)</span>
      </span>
    );
  }
  const up = diff > 0;
  const good = up === METRICS[metric].higherIsBetter;
  const shown =
    metric === "smoothness" || metric === "accuracy"
      ? `${Math.round(Math.abs(diff) * 100)} pts`
      : METRICS[metric].format(Math.abs(diff));
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap">
      {value}
      <span className={`inline-flex items-center gap-0.5 text-xs ${good ? "text-moss" : "text-brick"}`}>
        <svg aria-hidden="true" viewBox="0 0 10 10" className="h-2.5 w-2.5">
          <path d={up ? "M5 1 L9.5 9 H0.5 Z" : "M5 9 L9.5 1 H0.5 Z"} fill="currentColor" />
        </svg>
        <span aria-hidden="true">{shown}</span>
        <span className="sr-only">
          {up ? "up" : "down"} {shown} from last week
        </span>
      </span>
    </span>
  );
}
