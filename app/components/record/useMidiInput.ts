import { useCallback, useEffect, useRef, useState } from "react";
import type { PlayedEvent } from "~/browser/noteRecorder";
import {
  listenTo,
  listInputs,
  pickInput,
  rememberedInput,
  rememberInput,
  requestMidiAccess,
  watchInputs,
  webMidiSupported,
  type InputInfo,
} from "~/browser/webMidi.client";

export type AccessStatus = "checking" | "missing" | "idle" | "connecting" | "refused" | "failed" | "ready";

/**
 * Web MIDI access and the chosen keyboard. Connects by itself when the browser already
 * allowed MIDI for this site (so the last keyboard is ready on the next visit); otherwise it
 * waits for the student to press "Connect", as a permission prompt on page load is rude.
 * Every message is handed to `onEvent` (kept in a ref, so a new callback never re-subscribes).
 */
export function useMidiInput(onEvent: (event: PlayedEvent, timeMs: number) => void) {
  const [status, setStatus] = useState<AccessStatus>("checking");
  const [message, setMessage] = useState<string | null>(null);
  const [inputs, setInputs] = useState<InputInfo[]>([]);
  const [inputId, setInputId] = useState<string | null>(null);
  const access = useRef<MIDIAccess | null>(null);
  const handler = useRef(onEvent);
  handler.current = onEvent;

  const connect = useCallback(async () => {
    setStatus("connecting");
    const result = await requestMidiAccess();
    if (!result.ok) {
      setStatus(result.reason);
      setMessage(result.message);
      return;
    }
    access.current = result.access;
    const list = listInputs(result.access);
    setInputs(list);
    setInputId(pickInput(list, rememberedInput()));
    setStatus("ready");
  }, []);

  useEffect(() => {
    if (!webMidiSupported()) {
      setStatus("missing");
      return;
    }
    let cancelled = false;
    const permissions = navigator.permissions;
    if (!permissions?.query) {
      setStatus("idle");
      return;
    }
    permissions
      .query({ name: "midi" as PermissionName })
      .then((p) => {
        if (cancelled) return;
        if (p.state === "granted") void connect();
        else if (p.state === "denied") {
          setStatus("refused");
          setMessage("Access to MIDI devices is blocked for this site.");
        } else setStatus("idle");
      })
      .catch(() => {
        if (!cancelled) setStatus("idle");
      });
    return () => {
      cancelled = true;
    };
  }, [connect]);

  // Keyboards plugged in or out while the page is open.
  useEffect(() => {
    if (status !== "ready" || !access.current) return;
    return watchInputs(access.current, (list) => {
      setInputs(list);
      setInputId((current) =>
        current && list.some((i) => i.id === current) ? current : pickInput(list, rememberedInput()),
      );
    });
  }, [status]);

  useEffect(() => {
    if (status !== "ready" || !access.current || !inputId) return;
    return listenTo(access.current, inputId, (event, timeMs) => handler.current(event, timeMs));
  }, [status, inputId]);

  const choose = useCallback(
    (id: string) => {
      setInputId(id);
      const input = inputs.find((i) => i.id === id);
      if (input) rememberInput(input);
    },
    [inputs],
  );

  /** Remembers the keyboard a take was recorded from, for next time. */
  const remember = useCallback(() => {
    const input = inputs.find((i) => i.id === inputId);
    if (input) rememberInput(input);
  }, [inputs, inputId]);

  return { status, message, inputs, inputId, connect, choose, remember };
}
