// POST /api/harness/render: a WAV file through a design (Listen). Nothing is stored: the file is
// held in memory, decoded, filtered and answered as a 32-bit float WAV of the same sample rate,
// channel count and length. The work runs inline in the request, bounded by the size limits (60 s,
// 20 MB) and by at most RENDER_SLOTS renders at once (others get 503 and may retry).
import multer from 'multer';
import type { AppContext } from '@server/context';
import { HttpError, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { harnessResponse } from '@shared/audio/impulse';
import { renderChannels } from '@shared/audio/render';
import { readWav, readWavHeader, WavError, writeWav } from '@shared/audio/wav';
import { validateNetlist, type Netlist } from '@shared/circuit/netlist';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import type { HarnessValuesInput } from '@shared/schemas/harness';
import { RENDER_LIMITS, RenderFieldsSchema } from '@shared/schemas/listen';

const RENDER_SLOTS = 2;
let busy = 0;

/** The netlist a design body names (the same rule as /api/harness/simulate). */
function netlistOf(body: { preset?: string; netlist?: Netlist; values?: HarnessValuesInput }, field: string, override: Partial<HarnessValues> = {}): Netlist {
  if (body.netlist) {
    const problems = validateNetlist(body.netlist);
    if (problems.length > 0) throw unprocessable(`The ${field} netlist cannot be solved: ${problems[0]}`, { [`${field}.netlist`]: problems.join('; ') });
    return body.netlist;
  }
  const preset = body.preset ? getPreset(body.preset) : undefined;
  if (!preset) throw unprocessable(`Give the ${field} as a preset or a netlist (whole-instrument layouts are not rendered yet).`, { [`${field}.preset`]: 'Required.' });
  return preset.build({ ...preset.defaults, ...(body.values ?? {}), ...override } as HarnessValues);
}

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: RENDER_LIMITS.maxBytes, files: 1, fields: 5, parts: 6 } }).single('file');

export function renderRoutes(_ctx: AppContext) {
  const api = new ApiRouter('/api/harness');

  api.post('/render', {
    before: [upload],
    schemas: { body: RenderFieldsSchema },
    handle: ({ body, req, res }) => {
      const file = req.file;
      if (!file) throw new HttpError(422, 'invalid', 'Attach a WAV file in the "file" field.', { file: 'No file was sent.' });
      const bytes = new Uint8Array(file.buffer.buffer, file.buffer.byteOffset, file.buffer.byteLength);
      let header: ReturnType<typeof readWavHeader>;
      try {
        header = readWavHeader(bytes);
      } catch (e) {
        if (e instanceof WavError) throw new HttpError(422, 'invalid_file', e.message, { file: e.message });
        throw e;
      }
      const seconds = header.frames / header.sampleRate;
      if (seconds > RENDER_LIMITS.maxSeconds) {
        throw new HttpError(413, 'too_long', `The recording is ${seconds.toFixed(1)} s long; at most ${RENDER_LIMITS.maxSeconds} s can be rendered.`, { file: `At most ${RENDER_LIMITS.maxSeconds} s.` });
      }
      if (header.frames === 0) throw new HttpError(422, 'invalid_file', 'The WAV file holds no samples.', { file: 'No samples.' });
      const design = harnessResponse(netlistOf(body.design, 'design'), { volume: 10, tone: 10, ...(body.design.knobs ?? {}) });
      const chain = body.chain
        ? harnessResponse(netlistOf(body.chain, 'chain', body.chain.netlist ? {} : { ampR: body.chain.inputR, cableLength: body.chain.cableLength }), { volume: 10, tone: 10 })
        : undefined;
      if (busy >= RENDER_SLOTS) throw new HttpError(503, 'busy', 'Other recordings are being rendered; try again in a moment.');
      busy++;
      try {
        const wav = readWav(bytes);
        const out = renderChannels(wav.channels, wav.sampleRate, design, chain);
        const answer = writeWav(out, wav.sampleRate, 'float32');
        res.status(200).type('audio/wav').setHeader('Content-Disposition', 'attachment; filename="rendered.wav"');
        res.end(Buffer.from(answer.buffer, answer.byteOffset, answer.byteLength));
        return undefined;
      } catch (e) {
        if (e instanceof WavError) throw new HttpError(422, 'invalid_file', e.message, { file: e.message });
        throw e;
      } finally {
        busy--;
      }
    },
  });

  return api;
}
