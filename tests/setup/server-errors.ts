import { afterEach } from 'vitest';
import { takeServerErrors } from '../support/server-errors';

// A test after which a test app's server logged an error (an unhandled error, answered with a 500)
// fails, whatever status the test itself expected.
afterEach(() => {
  const errors = takeServerErrors();
  if (errors.length > 0) throw new Error(`the server logged ${errors.length} error(s):\n${errors.join('\n')}`);
});
