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

/** Bit c of masks[i]: channel c fires at i; of starts[i]: an episode of channel c starts at i. One pass over the points (a pass per channel costs several times more); channels that never fire are skipped. */
function markChannels(channels: readonly SignalChannel[], n: number): [Int32Array, Int32Array] {
  const masks = scratch.int32(0, n);
  const starts = scratch.int32(1, n);
  const active: Int8Array[] = [];
  const bits: number[] = [];
  channels.forEach(([, firing], channel) => {
    if (firing.indexOf(1) < 0 && firing.indexOf(-1) < 0 && firing.indexOf(2) < 0) return;
    active.push(firing);
    bits.push(channel);
  });
  let previous = 0;
  for (let i = 0; i < n; i++) {
    let mask = 0;
    for (let a = 0; a < active.length; a++) mask |= (active[a][i] !== 0 ? 1 : 0) << bits[a];
    masks[i] = mask;
    starts[i] = mask & ~previous;
    previous = mask;
  }
  return [masks, starts];
}

function signalList(channels: readonly SignalChannel[], mask: number): readonly PointSignalId[] {
  return Object.freeze(channels.filter((_, channel) => mask & (1 << channel)).map(([rule]) => rule));
}
