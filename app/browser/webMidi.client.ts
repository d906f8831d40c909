// The browser's Web MIDI API (Chromium-based browsers): asking for access, listing the
// connected keyboards, remembering the last one used, and passing each message on with its
// timestamp. Parsing lives in noteRecorder.ts (pure, tested); this file only touches the API.
import { parseMidiMessage, type PlayedEvent } from "./noteRecorder";

export type InputInfo = { id: string; name: string; manufacturer: string };

export type AccessResult =
  { ok: true; access: MIDIAccess } | { ok: false; reason: "missing" | "refused" | "failed"; message: string };

const STORAGE_KEY = "nearnote.recorder.input";

export function webMidiSupported(): boolean {
  return typeof navigator !== "undefined" && typeof navigator.requestMIDIAccess === "function";
}

/** Asks once for access; every failure becomes a plain answer (never an unhandled rejection). */
export async function requestMidiAccess(): Promise<AccessResult> {
  if (!webMidiSupported()) {
    return { ok: false, reason: "missing", message: "This browser cannot read a MIDI keyboard." };
  }
  try {
    const access = await navigator.requestMIDIAccess({ sysex: false });
    return { ok: true, access };
  } catch (e) {
    const name = e instanceof Error || e instanceof DOMException ? e.name : "";
    if (name === "NotAllowedError" || name === "SecurityError") {
      return { ok: false, reason: "refused", message: "Access to MIDI devices was refused." };
    }
    return {
      ok: false,
      reason: "failed",
      message: e instanceof Error ? e.message : "The MIDI devices could not be opened.",
    };
  }
}

export function listInputs(access: MIDIAccess): InputInfo[] {
  const out: InputInfo[] = [];
  access.inputs.forEach((input) => {
    if (input.state === "disconnected") return;
    out.push({ id: input.id, name: input.name || "MIDI input", manufacturer: input.manufacturer ?? "" });
  });
  return out;
}

/** Calls `onChange` whenever a keyboard is plugged in or out; returns the way to stop. */
export function watchInputs(access: MIDIAccess, onChange: (inputs: InputInfo[]) => void): () => void {
  const handler = () => onChange(listInputs(access));
  access.addEventListener("statechange", handler);
  return () => access.removeEventListener("statechange", handler);
}

export type RememberedInput = { id: string; name: string };

export function rememberInput(input: InputInfo): void {
  try {
    localStorage.setItem(STORAGE_KEY, JSON.stringify({ id: input.id, name: input.name }));
  } catch {
    // Storage may be full or blocked (private windows): remembering is a convenience only.
  }
}

export function rememberedInput(): RememberedInput | null {
  try {
    const raw = localStorage.getItem(STORAGE_KEY);
    if (!raw) return null;
    const value = JSON.parse(raw) as Partial<RememberedInput>;
    return typeof value.id === "string" && typeof value.name === "string" ? { id: value.id, name: value.name } : null;
  } catch {
    return null;
  }
}

/**
 * The input to preselect: the one used last time (ids can change when a keyboard is plugged
 * into another port, so the name is tried next), else the first one.
 */
export function pickInput(inputs: readonly InputInfo[], remembered: RememberedInput | null): string | null {
  if (inputs.length === 0) return null;
  if (remembered) {
    const byId = inputs.find((i) => i.id === remembered.id);
    if (byId) return byId.id;
    const byName = inputs.find((i) => i.name === remembered.name);
    if (byName) return byName.id;
  }
  return inputs[0].id;
}

/**
 * Passes every note and pedal message of one input on, with its time on the page's
 * `performance.now()` clock (a MIDIMessageEvent's timeStamp is on that clock). Setting
 * `onmidimessage` also opens the port.
 */
export function listenTo(
  access: MIDIAccess,
  inputId: string,
  onEvent: (event: PlayedEvent, timeMs: number) => void,
): () => void {
  const input = access.inputs.get(inputId);
  if (!input) return () => {};
  const handler = (e: MIDIMessageEvent) => {
    if (!e.data) return;
    const event = parseMidiMessage(e.data);
    if (event) onEvent(event, e.timeStamp > 0 ? e.timeStamp : performance.now());
  };
  input.onmidimessage = handler;
  return () => {
    if (input.onmidimessage === handler) input.onmidimessage = null;
  };
}
