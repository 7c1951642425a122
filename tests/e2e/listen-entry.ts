// The shared audio code as the browser runs it, bundled for the Listen end-to-end test.
import { harnessResponse, impulseResponse } from '@shared/audio/impulse';
import { synthesizePhrase } from '@shared/audio/phrase';
import { getPreset } from '@shared/circuit/presets';
import { seededNormals } from '@shared/random/seeded';

(globalThis as unknown as { lugbookAudio: unknown }).lugbookAudio = {
  harnessResponse,
  impulseResponse,
  synthesizePhrase,
  getPreset,
  seededNormals,
};
