// The Listen panel's audio graph (Web Audio). One looping source whose channels are the pickup
// tracks (the built-in phrase has one track per pickup place; a recording has one), fed to two
// slots, A and B. Each slot holds filter sets: one ConvolverNode per track (normalisation off, the
// impulse responses of shared/audio/impulse.ts) summed through a gain. A knob change builds a new
// set beside the old one and crossfades once the new convolvers have heard enough input to be
// right (the modelling delay plus a little): the sound follows within 50 ms. A/B ramps the slot
// gains, so both slots play the same point of the phrase. Then a master gain, a limiter (a
// compressor at ratio 20 with a hard knee) and a level meter.
import { useCallback, useEffect, useRef, useState } from 'react';
import { impulseResponse, ratioResponse, sumResponses, type ResponseFunction } from '@shared/audio/impulse';

export interface ListenPickup {
  /** Place along the string, fraction of the scale length from the bridge. */
  position: number;
  response: ResponseFunction;
}

/** A design as Listen hears it: its pickups, each with its own transfer at the current knobs. */
export interface ListenDesign {
  /** Changes whenever the sound changes (design, values, knobs). */
  key: string;
  label: string;
  pickups: ListenPickup[];
}

export type Slot = 'A' | 'B';

/** The source: the phrase's tracks (one per pickup) or a recording (one track, filtered by the ratio to its recording chain). */
export type ListenSource =
  { kind: 'phrase'; tracks: Float32Array[]; positions: number[] } | { kind: 'recording'; track: Float32Array; chain: ResponseFunction };

/** The track each filter of a design listens to: the phrase track of the pickup's place (−1: no such track), or the recording's one track. */
export function designChannels(design: ListenDesign, source: ListenSource): number[] {
  return source.kind === 'phrase' ? design.pickups.map((p) => source.positions.indexOf(p.position)) : [0];
}

interface FilterSet {
  gain: GainNode;
  convolvers: ConvolverNode[];
}

interface Graph {
  ctx: AudioContext;
  source: AudioBufferSourceNode;
  splitter: ChannelSplitterNode;
  slotGain: Record<Slot, GainNode>;
  sets: Record<Slot, FilterSet | null>;
  master: GainNode;
  limiter: DynamicsCompressorNode;
  analyser: AnalyserNode;
  tracks: number;
  source0: ListenSource;
}

/** The new convolvers wait this long (modelling delay of 10.7 ms and some of the response) before the crossfade starts. */
const SETTLE_S = 0.02;
/** Crossfade length: 25 ms, so the new sound is in place 45 ms after the change. */
const FADE_S = 0.025;

/** Impulse responses of a design for a source, as mono AudioBuffers at the context's rate. */
export function designBuffers(ctx: BaseAudioContext, design: ListenDesign, source: ListenSource): AudioBuffer[] {
  const responses: ResponseFunction[] =
    source.kind === 'phrase'
      ? design.pickups.map((p) => p.response)
      : // a recording carries the sum of the pickups already: one filter, H(design)/H(chain)
        [ratioResponse(sumResponses(design.pickups.map((p) => p.response)), source.chain)];
  return responses.map((r) => {
    const ir = impulseResponse(r, ctx.sampleRate);
    const buf = ctx.createBuffer(1, ir.samples.length, ctx.sampleRate);
    buf.copyToChannel(Float32Array.from(ir.samples), 0);
    return buf;
  });
}

/** Builds one filter set after the splitter (one convolver per track) into `out`, starting silent. */
export function buildFilterSet(
  ctx: BaseAudioContext,
  splitter: AudioNode,
  buffers: AudioBuffer[],
  out: AudioNode,
  gain0: number,
  channels?: readonly number[],
): FilterSet {
  const gain = new GainNode(ctx, { gain: gain0 });
  const convolvers = buffers.map((buffer, k) => {
    // disableNormalization first: the response's level is the point
    const c = new ConvolverNode(ctx, { disableNormalization: true, buffer });
    splitter.connect(c, channels?.[k] ?? k);
    c.connect(gain);
    return c;
  });
  gain.connect(out);
  return { gain, convolvers };
}

function dropSet(set: FilterSet, splitter: AudioNode) {
  for (const c of set.convolvers) {
    try {
      splitter.disconnect(c);
    } catch {
      /* already gone */
    }
    c.disconnect();
  }
  set.gain.disconnect();
}

export interface ListenState {
  playing: boolean;
  loop: boolean;
  active: Slot;
  /** Output level, dB (master gain). */
  levelDb: number;
  /** Peak of the output over the last tenth of a second, dBFS; null when silent or stopped. */
  meterDb: number | null;
  error: string | null;
}

export function useListenAudio(designs: Record<Slot, ListenDesign | null>) {
  const graph = useRef<Graph | null>(null);
  const [state, setState] = useState<ListenState>({ playing: false, loop: true, active: 'B', levelDb: -18, meterDb: null, error: null });
  const stateRef = useRef(state);
  stateRef.current = state;
  const designsRef = useRef(designs);
  designsRef.current = designs;

  const stop = useCallback(() => {
    const g = graph.current;
    graph.current = null;
    if (g) void g.ctx.close();
    setState((s) => ({ ...s, playing: false, meterDb: null }));
  }, []);

  useEffect(() => stop, [stop]);

  const applied = useRef<Record<Slot, string | undefined>>({ A: undefined, B: undefined });

  /** Starts playing the source that `makeSource` gives at the context's sample rate. */
  const play = useCallback(
    async (makeSource: (sampleRate: number, ctx: AudioContext) => Promise<ListenSource> | ListenSource) => {
      stop();
      try {
        const ctx = new AudioContext({ latencyHint: 'playback' });
        const source0 = await makeSource(ctx.sampleRate, ctx);
        const tracks = source0.kind === 'phrase' ? source0.tracks : [source0.track];
        const buffer = ctx.createBuffer(tracks.length, tracks[0]!.length, ctx.sampleRate);
        tracks.forEach((t, k) => buffer.copyToChannel(Float32Array.from(t), k));
        const source = new AudioBufferSourceNode(ctx, { buffer, loop: stateRef.current.loop });
        const splitter = new ChannelSplitterNode(ctx, { numberOfOutputs: tracks.length });
        source.connect(splitter);
        const master = new GainNode(ctx, { gain: 10 ** (stateRef.current.levelDb / 20) });
        const limiter = new DynamicsCompressorNode(ctx, { threshold: -6, knee: 0, ratio: 20, attack: 0.002, release: 0.2 });
        const analyser = new AnalyserNode(ctx, { fftSize: 2048 });
        master.connect(limiter).connect(analyser).connect(ctx.destination);
        const active = stateRef.current.active;
        const slotGain = { A: new GainNode(ctx, { gain: active === 'A' ? 1 : 0 }), B: new GainNode(ctx, { gain: active === 'B' ? 1 : 0 }) };
        slotGain.A.connect(master);
        slotGain.B.connect(master);
        const g: Graph = {
          ctx,
          source,
          splitter,
          slotGain,
          sets: { A: null, B: null },
          master,
          limiter,
          analyser,
          tracks: tracks.length,
          source0,
        };
        for (const slot of ['A', 'B'] as const) {
          const d = designsRef.current[slot];
          if (d)
            g.sets[slot] = buildFilterSet(ctx, splitter, designBuffers(ctx, d, source0), slotGain[slot], 1, designChannels(d, source0));
        }
        graph.current = g;
        applied.current = { A: designsRef.current.A?.key, B: designsRef.current.B?.key };
        source.onended = () => {
          if (graph.current === g) stop();
        };
        source.start();
        if (ctx.state === 'suspended') await ctx.resume();
        setState((s) => ({ ...s, playing: true, error: null }));
      } catch (e) {
        setState((s) => ({ ...s, playing: false, error: e instanceof Error ? e.message : String(e) }));
      }
    },
    [stop],
  );

  // a design (or its knobs) changed: new filter set beside the old, crossfade after SETTLE_S
  const keyA = designs.A?.key;
  const keyB = designs.B?.key;
  useEffect(() => {
    const g = graph.current;
    if (!g) {
      applied.current = { A: keyA, B: keyB };
      return;
    }
    for (const slot of ['A', 'B'] as const) {
      const d = designsRef.current[slot];
      const key = d?.key;
      if (key === applied.current[slot]) continue;
      applied.current[slot] = key;
      if (d && designChannels(d, g.source0).includes(-1)) {
        // a pickup at a place the playing phrase was not made for (another layout): start again
        stop();
        setState((s) => ({ ...s, error: 'The pickups changed; press Play again to hear the new layout.' }));
        return;
      }
      const old = g.sets[slot];
      const t0 = g.ctx.currentTime + SETTLE_S;
      const next = d
        ? buildFilterSet(g.ctx, g.splitter, designBuffers(g.ctx, d, g.source0), g.slotGain[slot], 0, designChannels(d, g.source0))
        : null;
      if (next) {
        next.gain.gain.setValueAtTime(0, t0);
        next.gain.gain.linearRampToValueAtTime(1, t0 + FADE_S);
      }
      if (old) {
        // the old set may itself be fading in: hold where it will be at t0, then ramp down
        const p = old.gain.gain;
        if (typeof p.cancelAndHoldAtTime === 'function') p.cancelAndHoldAtTime(t0);
        else {
          p.cancelScheduledValues(t0);
          p.setValueAtTime(p.value, t0);
        }
        p.linearRampToValueAtTime(0, t0 + FADE_S);
        setTimeout(() => dropSet(old, g.splitter), (SETTLE_S + FADE_S) * 1000 + 100);
      }
      g.sets[slot] = next;
    }
  }, [keyA, keyB, stop]);

  const setActive = useCallback((slot: Slot) => {
    setState((s) => ({ ...s, active: slot }));
    const g = graph.current;
    if (!g) return;
    const t = g.ctx.currentTime;
    for (const s of ['A', 'B'] as const) {
      const p = g.slotGain[s].gain;
      p.cancelScheduledValues(t);
      p.setValueAtTime(p.value, t);
      p.linearRampToValueAtTime(s === slot ? 1 : 0, t + FADE_S);
    }
  }, []);

  const setLoop = useCallback((loop: boolean) => {
    setState((s) => ({ ...s, loop }));
    if (graph.current) graph.current.source.loop = loop;
  }, []);

  const setLevelDb = useCallback((levelDb: number) => {
    setState((s) => ({ ...s, levelDb }));
    const g = graph.current;
    if (g) g.master.gain.setTargetAtTime(10 ** (levelDb / 20), g.ctx.currentTime, 0.01);
  }, []);

  // the meter: peak of the last analyser window, ten times a second
  useEffect(() => {
    if (!state.playing) return;
    const buf = new Float32Array(2048);
    const id = setInterval(() => {
      const g = graph.current;
      if (!g) return;
      g.analyser.getFloatTimeDomainData(buf);
      let peak = 0;
      for (let i = 0; i < buf.length; i++) peak = Math.max(peak, Math.abs(buf[i]!));
      setState((s) => ({ ...s, meterDb: peak > 1e-5 ? 20 * Math.log10(peak) : null }));
    }, 100);
    return () => clearInterval(id);
  }, [state.playing]);

  return { state, play, stop, setActive, setLoop, setLevelDb };
}
