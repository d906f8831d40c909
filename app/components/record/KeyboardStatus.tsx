import { Link, useLocation } from "react-router";
import { Button } from "~/components/Button";
import { FlashMessage } from "~/components/FlashMessage";
import { MiniKeyboard } from "~/components/take/MiniKeyboard";
import { noteLabel } from "~/utils/noteText";
import type { InputInfo } from "~/browser/webMidi.client";
import type { AccessStatus } from "./useMidiInput";

/** Points to file upload: on the upload page itself, to the panel beside this one. */
function FileUploadHint({ uploadHref }: { uploadHref: string }) {
  const { pathname } = useLocation();
  if (pathname === "/takes/new") return <>Use “From MIDI files” on this page to send a file instead.</>;
  return (
    <>
      You can still{" "}
      <Link to={uploadHref} className="font-semibold text-tide-dark underline underline-offset-4">
        upload a MIDI file
      </Link>{" "}
      exported from other software.
    </>
  );
}

/** What stands between the student and recording: no Web MIDI, no permission, no keyboard. */
export function AccessMessage({
  status,
  message,
  uploadHref,
  onConnect,
}: {
  status: AccessStatus;
  message: string | null;
  uploadHref: string;
  onConnect: () => void;
}) {
  if (status === "checking") return <p className="text-sm text-ink-soft">Looking for MIDI support…</p>;
  if (status === "missing") {
    return (
      <FlashMessage tone="info">
        <strong>This browser cannot record from a MIDI keyboard.</strong> Recording here needs the Web MIDI API, found
        in Chrome, Edge and other Chromium-based browsers. <FileUploadHint uploadHref={uploadHref} />
      </FlashMessage>
    );
  }
  if (status === "refused" || status === "failed") {
    return (
      <FlashMessage tone="error">
        <strong>{message ?? "MIDI devices could not be opened."}</strong>{" "}
        {status === "refused"
          ? "Allow MIDI devices for this site in the browser's site settings, then reload the page. "
          : "Reload the page to try again. "}
        <FileUploadHint uploadHref={uploadHref} />
      </FlashMessage>
    );
  }
  if (status === "idle" || status === "connecting") {
    return (
      <div className="flex flex-wrap items-center gap-3">
        <Button type="button" onClick={onConnect} pending={status === "connecting"} pendingLabel="Connecting…">
          Connect keyboard
        </Button>
        <p className="text-sm text-ink-soft">
          Plug your keyboard in by USB first. The browser asks once whether Nearnote may use MIDI devices.
        </p>
      </div>
    );
  }
  return null;
}

/** The keyboard to record from, and the keys held down right now. */
export function InputAndKeys({
  inputs,
  inputId,
  onChoose,
  held,
  disabled,
}: {
  inputs: InputInfo[];
  inputId: string | null;
  onChoose: (id: string) => void;
  held: number[];
  disabled: boolean;
}) {
  if (inputs.length === 0) {
    return (
      <FlashMessage tone="info">
        No MIDI keyboard is connected. Plug it in by USB and switch it on; it appears here by itself.
      </FlashMessage>
    );
  }
  const low = Math.min(36, ...held.map((m) => m - (m % 12)));
  const high = Math.max(95, ...held.map((m) => m + 11 - (m % 12)));
  return (
    <div className="flex flex-col gap-3">
      <label className="flex flex-wrap items-center gap-2 text-sm">
        <span className="font-semibold">Keyboard</span>
        <select
          value={inputId ?? ""}
          disabled={disabled}
          onChange={(e) => onChoose(e.target.value)}
          className="min-w-0 rounded-md border border-line bg-white px-3 py-1.5 text-base shadow-inner focus:border-tide"
        >
          {inputs.map((i) => (
            <option key={i.id} value={i.id}>
              {i.name}
              {i.manufacturer ? ` (${i.manufacturer})` : ""}
            </option>
          ))}
        </select>
      </label>
      {/* The drawing scales down to the column (max-w-full), so it never needs a scroll bar. */}
      <div data-testid="live-keys" data-held={held.join(" ")}>
        <MiniKeyboard
          notes={held}
          range={{ low, high }}
          label={held.length ? `Keys down: ${held.map((m) => noteLabel(m, null)).join(", ")}` : "No keys down"}
        />
      </div>
    </div>
  );
}
