// POST /api/harness/render: a WAV file through a design (Listen). Nothing is stored: the file is
// held in memory, decoded, filtered and answered as a 32-bit float WAV of the same sample rate,
// channel count and length. The work runs inline in the request, bounded by the size limits (60 s,
// 20 MB) and by at most RENDER_SLOTS renders at once (others get 503 and may retry).
import multer from 'multer';
import type { AppContext } from '@server/context';
import { HttpError, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { harnessResponse, instrumentResponses } from '@shared/audio/impulse';
import { pickupPositionOf, synthesizePhrase } from '@shared/audio/phrase';
import { renderChannels, renderPickupTracks } from '@shared/audio/render';
import { readWav, readWavHeader, WavError, writeWav } from '@shared/audio/wav';
import { validateNetlist, type Netlist } from '@shared/circuit/netlist';
import { HarnessUnsolvableError } from '@shared/circuit/solver';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import type { HarnessValuesInput } from '@shared/schemas/harness';
import { RENDER_LIMITS, RenderFieldsSchema } from '@shared/schemas/listen';
import { knobsOf, sourceOf } from './router';

const RENDER_SLOTS = 2;
let busy = 0;

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

export function renderRoutes(_ctx: AppContext) {
  const api = new ApiRouter('/api/harness');

  api.post('/render', {
    before: [upload],
    schemas: { body: RenderFieldsSchema },
    handle: ({ body, req, res }) => {
      const file = req.file;
      // the design: a preset, a netlist or a whole-instrument layout (the same body and rules as /api/harness/simulate)
      const source = sourceOf(body.design);
      const knobs = knobsOf(source.layout, body.design.knobs);
      let instrument: ReturnType<typeof instrumentResponses>;
      try {
        instrument = instrumentResponses(source.netlist, knobs);
      } catch (e) {
        if (e instanceof HarnessUnsolvableError) throw unprocessable(e.message, { design: e.message });
        throw e;
      }
      if (body.phrase) {
        if (file)
          throw unprocessable('Send a file or ask for the phrase, not both.', { phrase: 'Leave out the phrase when sending a file.' });
        if (body.chain) throw unprocessable('The built-in phrase has no recording chain.', { chain: 'Only for a recording.' });
        if (busy >= RENDER_SLOTS) throw new HttpError(503, 'busy', 'Other recordings are being rendered; try again in a moment.');
        busy++;
        try {
          // each pickup hears the string at its own place and goes through its own transfer
          const { sampleRate, seed } = body.phrase;
          const phrase = synthesizePhrase({
            sampleRate,
            seed,
            pickupPositions: instrument.pickups.map((p) => pickupPositionOf(p.pickupId)),
          });
          const out = renderPickupTracks(
            phrase.tracks,
            sampleRate,
            instrument.pickups.map((p) => p.response),
          );
          const answer = writeWav([out], sampleRate, 'float32');
          res.status(200).type('audio/wav').setHeader('Content-Disposition', 'attachment; filename="phrase.wav"');
          res.end(Buffer.from(answer.buffer, answer.byteOffset, answer.byteLength));
          return undefined;
        } finally {
          busy--;
        }
      }
      if (!file)
        throw new HttpError(422, 'invalid', 'Attach a WAV file in the "file" field (or ask for the built-in phrase).', {
          file: 'No file was sent.',
        });
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
        throw new HttpError(
          413,
          'too_long',
          `The recording is ${seconds.toFixed(1)} s long; at most ${RENDER_LIMITS.maxSeconds} s can be rendered.`,
          { file: `At most ${RENDER_LIMITS.maxSeconds} s.` },
        );
      }
      if (header.frames === 0) throw new HttpError(422, 'invalid_file', 'The WAV file holds no samples.', { file: 'No samples.' });
      // one source signal: it goes through the sum of the pickups' transfers
      const design = instrument.total;
      const chain = body.chain
        ? harnessResponse(
            chainNetlistOf(body.chain, 'chain', body.chain.netlist ? {} : { ampR: body.chain.inputR, cableLength: body.chain.cableLength }),
            { volume: 10, tone: 10 },
          )
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
