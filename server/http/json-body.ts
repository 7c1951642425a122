// A JSON body of megabytes (the analysis routes' 200,000 values or 20,000 points) is parsed and validated
// in the pool worker that computes with it, not on the request thread: the route reads its bytes
// (`jsonInWorker` in router.ts) and the job calls `parseJsonBody`. The refusals are those of the request
// thread's own parser and `validate`: 400 for text that is not JSON, 422 naming each field.
import type { z } from 'zod';
import { HttpError } from './errors';
import { issuesToFields } from './validate';

export function parseJsonBody<S extends z.ZodType>(bytes: Uint8Array, schema: S): z.output<S> {
  let value: unknown;
  try {
    value = bytes.byteLength === 0 ? {} : JSON.parse(new TextDecoder().decode(bytes));
  } catch {
    throw new HttpError(400, 'bad_request', 'The request body is not valid JSON.');
  }
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = issuesToFields(result.error.issues);
    const first = Object.entries(fields)[0]!;
    throw new HttpError(422, 'invalid', `${first[0]}: ${first[1]}`, fields);
  }
  return result.data;
}
