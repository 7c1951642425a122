// Two harness routes fall outside what src/lib/api-client offers: PUT /api/harnesses/:id (the
// client has no put helper) and POST /api/harness/netlist (answers with plain text, not JSON).
// This sends a JSON body the same way api-client does and turns the server's error envelope into
// the same typed ApiError. (If another feature needs PUT, adding `put` to api-client is better.)
import { ApiErrorSchema } from '@shared/schemas/common';
import { ApiError } from '@/lib/api-client';

export async function sendJson(method: 'PUT' | 'POST', path: string, body: unknown, accept = 'application/json'): Promise<string> {
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      credentials: 'same-origin',
      headers: { Accept: accept, 'Content-Type': 'application/json' },
      body: JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }
  const text = await response.text();
  if (!response.ok) {
    let data: unknown;
    try {
      data = text ? JSON.parse(text) : undefined;
    } catch {
      data = undefined;
    }
    const envelope = ApiErrorSchema.safeParse(data);
    if (envelope.success) throw new ApiError(response.status, envelope.data.error.code, envelope.data.error.message, envelope.data.error.fields);
    throw new ApiError(response.status, 'http_error', `The server answered ${response.status} ${response.statusText}.`.trim());
  }
  return text;
}
