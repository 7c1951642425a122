// The API client's error mapping: every failed answer becomes an ApiError carrying the server's
// envelope (docs: DEVELOPERS.md, decision 12), a network failure a status-0 ApiError, an abort
// stays an abort. fetch is replaced by a stub that answers like the server would.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, isApiError, withParams } from '@/lib/api-client';
import { applyServerError } from '@/lib/form';

function answer(status: number, body: string, statusText = ''): void {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(status === 204 ? null : body, { status, statusText })),
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
});

async function caught(p: Promise<unknown>): Promise<unknown> {
  try {
    await p;
  } catch (err) {
    return err;
  }
  throw new Error('the call did not fail');
}

describe('api client', () => {
  it('maps the error envelope: status, code, message, fields, issues and details', async () => {
    answer(
      422,
      JSON.stringify({
        error: {
          code: 'validation',
          message: 'Some fields are not valid.',
          fields: { 'points.3.resistance': 'Must be above zero.' },
          issues: [{ line: 5, column: 'R (kΩ)', message: 'not a number' }],
          details: { needsMapping: { columns: ['a', 'b'] } },
        },
      }),
    );
    const err = await caught(api.post('/api/parts', { label: 'x' }));
    expect(isApiError(err)).toBe(true);
    const e = err as ApiError;
    expect(e.status).toBe(422);
    expect(e.code).toBe('validation');
    expect(e.message).toBe('Some fields are not valid.');
    expect(e.fields).toEqual({ 'points.3.resistance': 'Must be above zero.' });
    expect(e.issues).toEqual([{ line: 5, column: 'R (kΩ)', message: 'not a number' }]);
    expect(e.details).toEqual({ needsMapping: { columns: ['a', 'b'] } });
  });

  it('an error without the envelope (a proxy page, empty body) says what the server answered', async () => {
    answer(502, '<html>Bad gateway</html>', 'Bad Gateway');
    const e = (await caught(api.get('/api/parts'))) as ApiError;
    expect(e).toBeInstanceOf(ApiError);
    expect(e.status).toBe(502);
    expect(e.code).toBe('http_error');
    expect(e.message).toBe('The server answered 502 Bad Gateway.');
    expect(e.issues).toEqual([]);
  });

  it('a network failure is status 0 with a message to check the connection; an abort stays an abort', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    const e = (await caught(api.get('/api/parts'))) as ApiError;
    expect(e.status).toBe(0);
    expect(e.code).toBe('network');
    expect(e.message).toMatch(/cannot be reached/);

    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new DOMException('The operation was aborted.', 'AbortError'))),
    );
    const abort = await caught(api.get('/api/parts'));
    expect(isApiError(abort)).toBe(false);
    expect((abort as DOMException).name).toBe('AbortError');
  });

  it('answers: JSON parsed, 204 undefined, text as text', async () => {
    answer(200, JSON.stringify({ parts: [1, 2] }));
    expect(await api.get('/api/parts')).toEqual({ parts: [1, 2] });
    answer(204, '');
    expect(await api.delete('/api/parts/1')).toBeUndefined();
    answer(200, '* netlist\n.end\n');
    expect(await api.post('/api/harness/netlist', {}, { as: 'text' })).toBe('* netlist\n.end\n');
  });

  it('sends JSON with its content type, and FormData without one (the browser writes the boundary)', async () => {
    const fetchMock = vi.fn(async (_url: string, _init: RequestInit) => new Response('{}', { status: 200 }));
    vi.stubGlobal('fetch', fetchMock);
    await api.post('/api/parts', { label: 'P-1' });
    const json = fetchMock.mock.calls[0]![1];
    expect((json.headers as Record<string, string>)['Content-Type']).toBe('application/json');
    expect(json.body).toBe('{"label":"P-1"}');
    const form = new FormData();
    form.set('file', new Blob(['a,b\n']), 'x.csv');
    await api.post('/api/sweeps', form);
    const multipart = fetchMock.mock.calls[1]![1];
    expect((multipart.headers as Record<string, string>)['Content-Type']).toBeUndefined();
    expect(multipart.body).toBe(form);
  });

  it('withParams leaves out empty values', () => {
    expect(withParams('/api/parts', { kind: 'pot', q: '', status: null, page: 2, x: undefined })).toBe('/api/parts?kind=pot&page=2');
    expect(withParams('/api/parts', { q: '' })).toBe('/api/parts');
    expect(withParams('/api/parts')).toBe('/api/parts');
  });
});

describe('applyServerError', () => {
  it('puts each known field message beside its field and the message at the top of the form', () => {
    const setError = vi.fn();
    const err = new ApiError(422, 'validation', 'Some fields are not valid.', { label: 'Taken.', unknownField: 'x' });
    applyServerError(err, setError, ['label', 'nominal']);
    expect(setError).toHaveBeenCalledWith('label', { type: 'server', message: 'Taken.' });
    expect(setError).toHaveBeenCalledWith('root.server', { type: '422', message: 'Some fields are not valid.' });
    expect(setError).toHaveBeenCalledTimes(2);
  });

  it('anything else becomes one message at the top', () => {
    const setError = vi.fn();
    applyServerError(new Error('boom'), setError, ['label']);
    expect(setError).toHaveBeenCalledWith('root.server', { type: 'unknown', message: 'boom' });
    applyServerError('not an error', setError, ['label']);
    expect(setError).toHaveBeenLastCalledWith('root.server', { type: 'unknown', message: 'Something went wrong.' });
  });
});
