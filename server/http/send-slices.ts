// Large answers (a lot's items: about 3 MB compressed, 9 MB not) written to the socket a slice at a
// time, one slice per turn of the event loop. Handed over whole, the answer goes to the kernel in one
// write as far as the socket's buffer takes it (4 MB on loopback), and eight such answers in one turn
// keep the request thread from every other request for tens of milliseconds. In slices, a health
// check or a small read waits for one slice at most.
import type { ServerResponse } from 'node:http';

/** Bytes written per turn of the event loop. */
export const SLICE_BYTES = 256 * 1024;

/**
 * Writes `parts` one after another, in slices of at most `sliceBytes`, then ends the answer. The
 * status and headers (Content-Length among them) are the caller's. Settles when the last slice is
 * handed over, or when the client went away (the rest is then dropped).
 */
export function sendInSlices(res: ServerResponse, parts: readonly Uint8Array[], sliceBytes = SLICE_BYTES): Promise<void> {
  return new Promise((resolve) => {
    let part = 0;
    let offset = 0;
    // A drain after a write the kernel took at once comes in a nextTick of that write: going on there
    // would write slice after slice in one turn. The next slice waits for the next turn either way.
    const onDrain = () => setImmediate(next);
    const done = () => {
      res.off('drain', onDrain);
      res.off('close', done);
      resolve();
    };
    function next() {
      if (res.destroyed) return done();
      while (part < parts.length && offset >= parts[part]!.length) {
        part++;
        offset = 0;
      }
      if (part === parts.length) {
        res.end();
        return done();
      }
      const bytes = parts[part]!;
      const slice = bytes.subarray(offset, offset + sliceBytes);
      offset += slice.length;
      // Past the socket's mark: go on when it drains; else on the next turn, after other requests.
      if (res.write(slice)) setImmediate(next);
    }
    res.on('drain', onDrain);
    res.once('close', done);
    next();
  });
}
