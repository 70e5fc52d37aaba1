import type { PointSignalId, SeriesSignal } from "./analyze-types";
import { Scratch } from "./scratch";

const NO_SIGNALS: readonly PointSignalId[] = Object.freeze([]);
const scratch = new Scratch();

/** A signal source: its id, its firing per point (0 quiet, ±1 with a side, 2 without) and its message for a direction. */
export type SignalChannel = [rule: PointSignalId, firing: Int8Array, describe: (direction: number) => string];

/** Per point the list of firing channels (one frozen list shared per combination), and one signal per episode (the first point of each run of firing points) ordered by index, then channel; each message is built once per channel and direction. */
export function collectSignals(channels: readonly SignalChannel[], n: number): { pointSignals: (readonly PointSignalId[])[]; signals: SeriesSignal[] } {
  const [masks, starts] = markChannels(channels, n);
  // Points share one frozen list per combination of firing channels: most firing points repeat a few combinations.
  const lists = new Map<number, readonly PointSignalId[]>([[0, NO_SIGNALS]]);
  const pointSignals: (readonly PointSignalId[])[] = new Array(n);
  const signals: SeriesSignal[] = [];
  const messages: string[] = [];
  let mask = 0;
  let list = NO_SIGNALS;
  for (let i = 0; i < n; i++) {
    if (masks[i] !== mask) {
      mask = masks[i];
      list = lists.get(mask) ?? signalList(channels, mask);
      lists.set(mask, list);
    }
    pointSignals[i] = list;
    // By index, then in channel order: the order a stable sort of the per-channel episode lists gives.
    for (let channel = 0; starts[i] !== 0 && channel < channels.length; channel++) {
      if (starts[i] & (1 << channel)) {
        const [rule, firing, describe] = channels[channel];
        const key = 4 * channel + firing[i] + 1;
        messages[key] ??= describe(firing[i]);
        signals.push({ rule, index: i, message: messages[key] });
      }
    }
  }
  return { pointSignals, signals };
}

/** Bit c of masks[i]: channel c fires at i; of starts[i]: an episode of channel c starts at i. Episodes are found with the typed arrays' own indexOf, which scans far faster than a loop over every point of every channel. */
function markChannels(channels: readonly SignalChannel[], n: number): [Int32Array, Int32Array] {
  const masks = scratch.int32(0, n).fill(0);
  const starts = scratch.int32(1, n).fill(0);
  for (let channel = 0; channel < channels.length; channel++) {
    const firing = channels[channel][1];
    const bit = 1 << channel;
    // Next position of each firing value at or after `from` (n when none is left), refreshed once passed.
    const next = [1, -1, 2].map((value) => ({ value, at: -1 }));
    const nextFiring = (from: number) => {
      let first = n;
      for (const entry of next) {
        if (entry.at !== n && entry.at < from) entry.at = indexOrEnd(firing, entry.value, from, n);
        first = Math.min(first, entry.at);
      }
      return first;
    };
    // An episode runs from a firing point to the next quiet one, whatever the sides in between.
    let end = 0;
    for (let start = nextFiring(0); start < n; start = nextFiring(end)) {
      end = indexOrEnd(firing, 0, start, n);
      starts[start] |= bit;
      for (let i = start; i < end; i++) masks[i] |= bit;
    }
  }
  return [masks, starts];
}

function indexOrEnd(values: Int8Array, value: number, from: number, n: number): number {
  const at = values.indexOf(value, from);
  return at < 0 ? n : at;
}

function signalList(channels: readonly SignalChannel[], mask: number): readonly PointSignalId[] {
  return Object.freeze(channels.filter((_, channel) => mask & (1 << channel)).map(([rule]) => rule));
}
