// Deterministic damage to MIDI files, shared by the fuzz test and `npm run bench`.
import { seededRandom } from "../../scripts/lib/takeGenerator";

export type Mutant = {
  index: number;
  sample: number;
  kind: "flip" | "truncate" | "duplicate-chunk" | "length";
  bytes: Uint8Array;
};

/** Offsets of the chunks ("MThd", "MTrk") in a Standard MIDI File. */
function chunks(bytes: Uint8Array): { start: number; end: number }[] {
  const out: { start: number; end: number }[] = [];
  let at = 0;
  while (at + 8 <= bytes.length) {
    const len = ((bytes[at + 4] << 24) | (bytes[at + 5] << 16) | (bytes[at + 6] << 8) | bytes[at + 7]) >>> 0;
    const end = Math.min(bytes.length, at + 8 + len);
    out.push({ start: at, end });
    at = end;
  }
  return out;
}

export function* mutations(samples: Uint8Array[], count: number, seed: number): Generator<Mutant> {
  // Seeded, so every run damages the files the same way.
  const rand = seededRandom(seed);
  const kinds: Mutant["kind"][] = ["flip", "truncate", "duplicate-chunk", "length"];
  for (let index = 0; index < count; index++) {
    const sample = Math.floor(rand() * samples.length);
    const source = samples[sample];
    const kind = kinds[index % kinds.length];
    let bytes: Uint8Array;
    if (kind === "flip") {
      bytes = source.slice();
      const flips = 1 + Math.floor(rand() * 8);
      for (let i = 0; i < flips; i++) bytes[Math.floor(rand() * bytes.length)] ^= 1 << Math.floor(rand() * 8);
    } else if (kind === "truncate") {
      bytes = source.slice(0, Math.floor(rand() * source.length));
    } else if (kind === "duplicate-chunk") {
      const list = chunks(source);
      const c = list[Math.floor(rand() * list.length)];
      const copy = source.slice(c.start, c.end);
      const at = list[Math.floor(rand() * list.length)].end;
      bytes = new Uint8Array(source.length + copy.length);
      bytes.set(source.slice(0, at));
      bytes.set(copy, at);
      bytes.set(source.slice(at), at + copy.length);
    } else {
      // A chunk length or header field set to an absurd value.
      bytes = source.slice();
      const list = chunks(bytes);
      const c = list[Math.floor(rand() * list.length)];
      const value = [0xffffffff, 0x7fffffff, 0, 1][Math.floor(rand() * 4)];
      new DataView(bytes.buffer).setUint32(c.start + 4, value);
      if (rand() < 0.5) new DataView(bytes.buffer).setUint16(10, Math.floor(rand() * 65536)); // track count
    }
    yield { index, sample, kind, bytes };
  }
}
