// Rendering a recording (or any source signal) through a design: one impulse response for the
// whole file, every channel convolved with it, the length kept (the tail cut).
import { convolve, prepareFilter } from './convolve';
import { impulseResponse, ratioResponse, type ResponseFunction } from './impulse';

/** Largest boost of H(design)/H(recording chain), dB: beyond it the recording's own noise would be raised without bound. */
export const MAX_CHAIN_BOOST_DB = 12;

/**
 * The channels through `design`; with `chain` (how the recording was made), through
 * H(design)/H(chain) with the boost limited to +12 dB, so the pickup is not counted twice.
 */
export function renderChannels(
  channels: readonly Float32Array[],
  sampleRate: number,
  design: ResponseFunction,
  chain?: ResponseFunction,
): Float32Array[] {
  const response = chain ? ratioResponse(design, chain, MAX_CHAIN_BOOST_DB) : design;
  const filter = prepareFilter(impulseResponse(response, sampleRate));
  return channels.map((c) => convolve(c, filter));
}

/**
 * The built-in phrase through a whole instrument: track k (the string heard at pickup k's place)
 * through pickup k's own transfer, the results summed (mono), the length kept.
 */
export function renderPickupTracks(
  tracks: readonly Float32Array[],
  sampleRate: number,
  pickups: readonly ResponseFunction[],
): Float32Array {
  if (tracks.length !== pickups.length) throw new Error('renderPickupTracks: one track per pickup');
  const length = tracks[0]?.length ?? 0;
  const out = new Float32Array(length);
  tracks.forEach((track, k) => {
    const y = convolve(track, prepareFilter(impulseResponse(pickups[k]!, sampleRate)));
    for (let i = 0; i < length; i++) out[i]! += y[i]!;
  });
  return out;
}
