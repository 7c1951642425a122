// POST /api/harness/render: a WAV file through a design (Listen). Nothing is stored: the file is
// held in memory, decoded, filtered and answered as a 32-bit float WAV of the same sample rate,
// channel count and length. The file's header and size are checked here; the rendering runs in the job
// pool (server/pool), bounded by the size limits (60 s, 20 MB) and the pool's queue and time budget.
import multer from 'multer';
import type { AppContext } from '@server/context';
import { HttpError, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { sendDownload } from '@server/http/encoded';
import { readWavHeader, WavError } from '@shared/audio/wav';
import { validateNetlist, type Netlist } from '@shared/circuit/netlist';
import { HarnessUnsolvableError } from '@shared/circuit/solver';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import type { HarnessValuesInput } from '@shared/schemas/harness';
import { RENDER_LIMITS, RenderFieldsSchema } from '@shared/schemas/listen';
import { knobsOf, sourceOf } from './router';

/** A render in the pool; the engine's refusals (an unsolvable design, a WAV it cannot read) are 422s naming the field. */
async function rendered(run: () => Promise<Uint8Array>): Promise<Uint8Array> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof HarnessUnsolvableError) throw unprocessable(e.message, { design: e.message });
    if (e instanceof WavError) throw new HttpError(422, 'invalid_file', e.message, { file: e.message });
    throw e;
  }
}

/** The netlist of a recording chain (a preset with the recorder's input, or a netlist). */
function chainNetlistOf(
  body: { preset?: string; netlist?: Netlist; values?: HarnessValuesInput },
  field: string,
  override: Partial<HarnessValues> = {},
): Netlist {
  if (body.netlist) {
    const problems = validateNetlist(body.netlist);
    if (problems.length > 0)
      throw unprocessable(`The ${field} netlist cannot be solved: ${problems[0]}`, { [`${field}.netlist`]: problems.join('; ') });
    return body.netlist;
  }
  const preset = body.preset ? getPreset(body.preset) : undefined;
  if (!preset) throw unprocessable(`Give the ${field} as a preset or a netlist.`, { [`${field}.preset`]: 'Required.' });
  return preset.build({ ...preset.defaults, ...(body.values ?? {}), ...override } as HarnessValues);
}

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: RENDER_LIMITS.maxBytes, files: 1, fields: 5, parts: 6 },
}).single('file');

export function renderRoutes({ pool }: AppContext) {
  const api = new ApiRouter('/api/harness');

  api.post('/render', {
    before: [upload],
    schemas: { body: RenderFieldsSchema },
    handle: async ({ body, req, res }) => {
      const file = req.file;
      // the design: a preset, a netlist or a whole-instrument layout (the same body and rules as /api/harness/simulate)
      const source = sourceOf(body.design);
      const knobs = knobsOf(source.layout, body.design.knobs);
      if (body.phrase) {
        if (file)
          throw unprocessable('Send a file or ask for the phrase, not both.', { phrase: 'Leave out the phrase when sending a file.' });
        if (body.chain) throw unprocessable('The built-in phrase has no recording chain.', { chain: 'Only for a recording.' });
        const answer = await rendered(() =>
          pool.run('render', { netlist: source.netlist, knobs, phrase: { sampleRate: body.phrase!.sampleRate, seed: body.phrase!.seed } }),
        );
        await sendDownload(res, answer, 'audio/wav', 'phrase.wav');
        return undefined;
      }
      if (!file)
        throw new HttpError(422, 'invalid', 'Attach a WAV file in the "file" field (or ask for the built-in phrase).', {
          file: 'No file was sent.',
        });
      let header: ReturnType<typeof readWavHeader>;
      try {
        header = readWavHeader(new Uint8Array(file.buffer.buffer, file.buffer.byteOffset, file.buffer.byteLength));
      } catch (e) {
        if (e instanceof WavError) throw new HttpError(422, 'invalid_file', e.message, { file: e.message });
        throw e;
      }
      const seconds = header.frames / header.sampleRate;
      if (seconds > RENDER_LIMITS.maxSeconds) {
        throw new HttpError(
          413,
          'too_long',
          `The recording is ${seconds.toFixed(1)} s long; at most ${RENDER_LIMITS.maxSeconds} s can be rendered.`,
          { file: `At most ${RENDER_LIMITS.maxSeconds} s.` },
        );
      }
      if (header.frames === 0) throw new HttpError(422, 'invalid_file', 'The WAV file holds no samples.', { file: 'No samples.' });
      // one source signal: it goes through the sum of the pickups' transfers
      const chain = body.chain
        ? chainNetlistOf(body.chain, 'chain', body.chain.netlist ? {} : { ampR: body.chain.inputR, cableLength: body.chain.cableLength })
        : undefined;
      // The file's bytes are moved to the worker; copied first only when they share memory with other data.
      const own = file.buffer.byteOffset === 0 && file.buffer.byteLength === file.buffer.buffer.byteLength;
      const wav = own ? new Uint8Array(file.buffer.buffer) : new Uint8Array(file.buffer);
      const answer = await rendered(() =>
        pool.run(
          'render',
          { netlist: source.netlist, knobs, wav, ...(chain ? { chain: { netlist: chain } } : {}) },
          { transfer: [wav.buffer as ArrayBuffer] },
        ),
      );
      await sendDownload(res, answer, 'audio/wav', 'rendered.wav');
      return undefined;
    },
  });

  return api;
}
