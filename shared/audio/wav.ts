// WAV files (RIFF WAVE: Microsoft and IBM, "Multimedia Programming Interface and Data
// Specifications 1.0", 1991; WAVE_FORMAT_EXTENSIBLE: Microsoft, "Multiple channel audio data and
// WAVE files", 2001 — cited from memory). The npm package wavefile reads the chunks and writes
// files; the sample words are decoded here with a DataView, because the package reads an
// extensible float file as integers and its per-sample unpacking is slow on long files.
import * as wavefileModule from 'wavefile';

type WaveFileClass = typeof import('wavefile').WaveFile;
// The package's ES entry exports { WaveFile }; its CommonJS entry (what Node loads) exports an
// object holding it, which Node presents as the default export.
const ns = wavefileModule as unknown as { WaveFile?: WaveFileClass; default?: { WaveFile: WaveFileClass } };
const WaveFile: WaveFileClass = ns.WaveFile ?? ns.default!.WaveFile;

export type WavSampleFormat = 'pcm16' | 'pcm24' | 'float32';

export interface DecodedWav {
  sampleRate: number;
  /** One array per channel, samples in −1…1 (full scale). */
  channels: Float32Array[];
  format: WavSampleFormat;
  /** True when the file used WAVE_FORMAT_EXTENSIBLE. */
  extensible: boolean;
}

/** A file this reader refuses, with a message that names the problem. */
export class WavError extends Error {}

export const WAV_LIMITS = { minSampleRate: 22050, maxSampleRate: 96000, maxChannels: 2 } as const;

const PCM = 1;
const FLOAT = 3;
const EXTENSIBLE = 0xfffe;

interface FmtChunk {
  audioFormat: number;
  numChannels: number;
  sampleRate: number;
  bitsPerSample: number;
  blockAlign: number;
  subformat: number[];
}

/** Reads the header only: sample rate, channel count, frame count (for a size check before decoding). */
export function readWavHeader(bytes: Uint8Array): {
  sampleRate: number;
  channels: number;
  frames: number;
  format: WavSampleFormat;
  extensible: boolean;
  dataOffset: number;
  dataBytes: number;
} {
  if (bytes.length < 12 || ascii(bytes, 0) !== 'RIFF' || ascii(bytes, 8) !== 'WAVE') {
    throw new WavError('The file is not a WAV file (it does not start with RIFF…WAVE).');
  }
  let wav: InstanceType<WaveFileClass>;
  try {
    wav = new WaveFile();
    // chunks only; the samples are decoded below
    wav.fromBuffer(bytes, false);
  } catch (e) {
    throw new WavError(`The WAV file could not be read: ${e instanceof Error ? e.message : String(e)}`);
  }
  const fmt = (wav as unknown as { fmt: FmtChunk }).fmt;
  let code = fmt.audioFormat;
  const extensible = code === EXTENSIBLE;
  if (extensible) {
    // the first two bytes of the sub-format GUID carry the format code
    code = (fmt.subformat[0] ?? 0) & 0xffff;
  }
  let format: WavSampleFormat;
  if (code === PCM && fmt.bitsPerSample === 16) format = 'pcm16';
  else if (code === PCM && fmt.bitsPerSample === 24) format = 'pcm24';
  else if (code === FLOAT && fmt.bitsPerSample === 32) format = 'float32';
  else {
    const what =
      code === PCM ? `${fmt.bitsPerSample}-bit PCM` : code === FLOAT ? `${fmt.bitsPerSample}-bit floating point` : `format code ${code}`;
    throw new WavError(`The WAV file holds ${what}; use 16- or 24-bit PCM or 32-bit floating point.`);
  }
  if (fmt.numChannels < 1 || fmt.numChannels > WAV_LIMITS.maxChannels) {
    throw new WavError(`The WAV file has ${fmt.numChannels} channels; use mono or stereo.`);
  }
  if (fmt.sampleRate < WAV_LIMITS.minSampleRate || fmt.sampleRate > WAV_LIMITS.maxSampleRate) {
    throw new WavError(`The WAV file's sample rate is ${fmt.sampleRate} Hz; use 22050 to 96000 Hz.`);
  }
  const frameBytes = (fmt.bitsPerSample / 8) * fmt.numChannels;
  const data = findChunk(bytes, 'data');
  if (!data) throw new WavError('The WAV file has no data chunk.');
  // a file cut short keeps the frames it has
  const dataBytes = Math.min(data.size, bytes.length - data.offset);
  return {
    sampleRate: fmt.sampleRate,
    channels: fmt.numChannels,
    frames: Math.floor(dataBytes / frameBytes),
    format,
    extensible,
    dataOffset: data.offset,
    dataBytes,
  };
}

/** Decodes a WAV file of 16- or 24-bit PCM or 32-bit float, plain or WAVE_FORMAT_EXTENSIBLE, mono or stereo. */
export function readWav(bytes: Uint8Array): DecodedWav {
  const h = readWavHeader(bytes);
  const view = new DataView(bytes.buffer, bytes.byteOffset + h.dataOffset, h.dataBytes);
  const channels = Array.from({ length: h.channels }, () => new Float32Array(h.frames));
  const nc = h.channels;
  if (h.format === 'pcm16') {
    for (let i = 0; i < h.frames; i++) for (let c = 0; c < nc; c++) channels[c]![i] = view.getInt16((i * nc + c) * 2, true) / 32768;
  } else if (h.format === 'pcm24') {
    for (let i = 0; i < h.frames; i++) {
      for (let c = 0; c < nc; c++) {
        const o = (i * nc + c) * 3;
        const v = view.getUint8(o) | (view.getUint8(o + 1) << 8) | (view.getInt8(o + 2) << 16);
        channels[c]![i] = v / 8388608;
      }
    }
  } else {
    for (let i = 0; i < h.frames; i++) {
      for (let c = 0; c < nc; c++) {
        const v = view.getFloat32((i * nc + c) * 4, true);
        if (!Number.isFinite(v)) throw new WavError(`The WAV file has a sample that is not a number (frame ${i + 1}, channel ${c + 1}).`);
        channels[c]![i] = v;
      }
    }
  }
  return { sampleRate: h.sampleRate, channels, format: h.format, extensible: h.extensible };
}

/**
 * A WAV file of the channels: 32-bit float (values as they are; format code 3 with a fact chunk, as
 * the RIFF specification asks of non-PCM data) or 16-bit PCM (clipped to full scale, rounded to the
 * nearest step). Written here rather than by the package, whose per-sample packing took seconds
 * for ten seconds of float audio; the tests read every file written here back with the package.
 */
export function writeWav(channels: readonly Float32Array[], sampleRate: number, format: 'float32' | 'pcm16' = 'float32'): Uint8Array {
  const frames = channels[0]?.length ?? 0;
  const nc = channels.length;
  const bytesPer = format === 'float32' ? 4 : 2;
  const dataBytes = frames * nc * bytesPer;
  const fmtBytes = format === 'float32' ? 18 : 16;
  const factBytes = format === 'float32' ? 12 : 0;
  const total = 12 + 8 + fmtBytes + factBytes + 8 + dataBytes + (dataBytes % 2);
  const out = new Uint8Array(total);
  const v = new DataView(out.buffer);
  let at = 0;
  const tag = (s: string) => {
    for (let i = 0; i < 4; i++) out[at + i] = s.charCodeAt(i);
    at += 4;
  };
  const u32 = (x: number) => {
    v.setUint32(at, x, true);
    at += 4;
  };
  const u16 = (x: number) => {
    v.setUint16(at, x, true);
    at += 2;
  };
  tag('RIFF');
  u32(total - 8);
  tag('WAVE');
  tag('fmt ');
  u32(fmtBytes);
  u16(format === 'float32' ? FLOAT : PCM);
  u16(nc);
  u32(sampleRate);
  u32(sampleRate * nc * bytesPer);
  u16(nc * bytesPer);
  u16(bytesPer * 8);
  if (format === 'float32') {
    u16(0); // cbSize
    tag('fact');
    u32(4);
    u32(frames);
  }
  tag('data');
  u32(dataBytes);
  for (let i = 0; i < frames; i++) {
    for (let c = 0; c < nc; c++) {
      const x = channels[c]![i]!;
      if (format === 'float32') {
        v.setFloat32(at, x, true);
        at += 4;
      } else {
        v.setInt16(at, Math.round(Math.max(-1, Math.min(1, x)) * 32767), true);
        at += 2;
      }
    }
  }
  return out;
}

function ascii(bytes: Uint8Array, at: number): string {
  return String.fromCharCode(bytes[at]!, bytes[at + 1]!, bytes[at + 2]!, bytes[at + 3]!);
}

/** The first chunk of that id at the top level of the RIFF file: where its body starts and its declared size. */
function findChunk(bytes: Uint8Array, id: string): { offset: number; size: number } | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let at = 12;
  while (at + 8 <= bytes.length) {
    const size = view.getUint32(at + 4, true);
    if (ascii(bytes, at) === id) return { offset: at + 8, size };
    at += 8 + size + (size % 2);
  }
  return null;
}
