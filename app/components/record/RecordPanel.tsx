import { lazy, Suspense } from "react";
import { Card } from "~/components/Card";
import type { RecordPanelProps } from "./RecordPanelContent";

// The recorder, metronome, live grading and playback load as their own chunk after the
// page, only on the pages that show the panel.
const RecordPanelContent = lazy(() => import("./RecordPanelContent"));

/**
 * Record a take from a MIDI keyboard, graded chord by chord while playing, then play it back,
 * discard it or upload it as a Standard MIDI File through the same API as a file upload.
 */
export function RecordPanel(props: RecordPanelProps) {
  return (
    <Suspense
      fallback={
        <Card title="Record from your keyboard">
          <p className="text-sm text-ink-soft">Getting the recorder ready…</p>
        </Card>
      }
    >
      <RecordPanelContent {...props} />
    </Suspense>
  );
}
