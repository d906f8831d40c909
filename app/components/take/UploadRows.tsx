import type { ReactNode } from "react";
import { Link } from "react-router";
import { formatBytes, type UploadRow } from "~/takes/uploadRows";
import { percent } from "~/utils/noteText";

const STAGE: Record<UploadRow["stage"], { label: string; tone: string }> = {
  ready: { label: "Ready to upload", tone: "bg-paper text-ink-soft" },
  uploading: { label: "Uploading", tone: "bg-tide-pale text-tide-dark" },
  analysing: { label: "Analysing…", tone: "bg-tide-pale text-tide-dark" },
  analysed: { label: "Analysed", tone: "bg-moss-pale text-moss" },
  failed: { label: "Kept, not analysed", tone: "bg-ochre-pale text-ochre" },
  duplicate: { label: "Uploaded before", tone: "bg-ochre-pale text-ochre" },
  refused: { label: "Not uploaded", tone: "bg-brick-pale text-brick" },
};

/**
 * One line per file: its stage, a progress bar while sending, then its figures or its error;
 * `extras` adds what a page shows under a file (its own exercise, a warning about it).
 */
export function UploadRows({
  rows,
  onRemove,
  extras,
}: {
  rows: UploadRow[];
  onRemove?: (key: string) => void;
  extras?: (row: UploadRow) => ReactNode;
}) {
  if (rows.length === 0) return null;
  return (
    <ul aria-label="Files" className="flex flex-col divide-y divide-line rounded-lg border border-line bg-card">
      {rows.map((row) => {
        const stage = STAGE[row.stage];
        return (
          <li key={row.key} className="flex flex-col gap-2 px-4 py-3" data-testid="upload-row" data-stage={row.stage}>
            <div className="flex flex-wrap items-center justify-between gap-3">
              <span className="min-w-0 truncate font-semibold" title={row.fileName}>
                {row.fileName}{" "}
                {row.size ? <span className="text-xs font-normal text-ink-soft">{formatBytes(row.size)}</span> : null}
              </span>
              <span className="flex items-center gap-3">
                <span className={`rounded px-2 py-0.5 text-xs font-semibold ${stage.tone}`} role="status">
                  {stage.label}
                  {row.stage === "uploading" ? ` ${Math.round(row.progress * 100)}%` : ""}
                </span>
                {row.stage === "ready" && onRemove ? (
                  <button
                    type="button"
                    onClick={() => onRemove(row.key)}
                    className="text-sm text-tide-dark hover:underline"
                  >
                    Remove<span className="sr-only"> {row.fileName}</span>
                  </button>
                ) : null}
              </span>
            </div>
            {row.stage === "uploading" || row.stage === "analysing" ? (
              <div
                role="progressbar"
                aria-label={`Upload of ${row.fileName}`}
                aria-valuemin={0}
                aria-valuemax={100}
                aria-valuenow={Math.round(row.progress * 100)}
                className="h-2 overflow-hidden rounded-full bg-paper"
              >
                <div
                  className={`h-full rounded-full bg-tide transition-[width] ${row.stage === "analysing" ? "animate-pulse" : ""}`}
                  style={{ width: `${Math.round(row.progress * 100)}%` }}
                />
              </div>
            ) : null}
            {row.stage === "analysed" && row.takeId ? (
              <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
                <span>
                  {row.chordCount} chords · smoothness {percent(row.smoothness)} · score {row.score}
                </span>
                <Link
                  to={`/takes/${row.takeId}`}
                  className="font-semibold text-tide-dark underline-offset-4 hover:underline"
                >
                  Open take<span className="sr-only"> {row.fileName}</span>
                </Link>
              </p>
            ) : null}
            {row.error ? (
              <p className="flex flex-wrap items-center gap-x-4 text-sm">
                <span className={row.stage === "refused" ? "text-brick" : "text-ochre"}>{row.error}</span>
                {row.takeId ? (
                  <Link
                    to={`/takes/${row.takeId}`}
                    className="font-semibold text-tide-dark underline-offset-4 hover:underline"
                  >
                    {row.stage === "duplicate" ? "Open the earlier take" : "See the stored take"}
                  </Link>
                ) : null}
              </p>
            ) : null}
            {extras?.(row)}
          </li>
        );
      })}
    </ul>
  );
}
