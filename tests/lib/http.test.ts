import { postJson, retryAfterSeconds, waitInWords } from '@/lib/http';

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  fetchMock.mockReset();
});

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

describe('retryAfterSeconds', () => {
  // RFC 9110 section 10.2.3: Retry-After is delay-seconds or an HTTP-date.
  it('reads delay-seconds', () => {
    expect(retryAfterSeconds('120')).toBe(120);
    expect(retryAfterSeconds(' 0 ')).toBe(0);
  });

  it('reads an HTTP date as the seconds until then, never below zero', () => {
    const now = Date.parse('Wed, 02 Dec 2026 14:00:00 GMT');
    expect(retryAfterSeconds('Wed, 02 Dec 2026 14:01:30 GMT', now)).toBe(90);
    expect(retryAfterSeconds('Wed, 02 Dec 2026 13:00:00 GMT', now)).toBe(0);
  });

  it('ignores a missing or meaningless header', () => {
    expect(retryAfterSeconds(null)).toBeUndefined();
    expect(retryAfterSeconds('')).toBeUndefined();
    expect(retryAfterSeconds('soon')).toBeUndefined();
    expect(retryAfterSeconds('-5')).toBeUndefined();
  });
});

describe('waitInWords', () => {
  it('rounds up to whole seconds, minutes or hours, singular for one', () => {
    expect(waitInWords(0)).toBe('1 second');
    expect(waitInWords(1)).toBe('1 second');
    expect(waitInWords(45)).toBe('45 seconds');
    expect(waitInWords(60)).toBe('1 minute');
    expect(waitInWords(61)).toBe('2 minutes');
    expect(waitInWords(15 * 60)).toBe('15 minutes');
    expect(waitInWords(3600)).toBe('1 hour');
    expect(waitInWords(3 * 3600 - 1)).toBe('3 hours');
  });
});

describe('postJson', () => {
  it('sends JSON and answers the parsed body of a 2xx', async () => {
    fetchMock.mockResolvedValueOnce(new Response('{"a":1}', { status: 200 }));
    expect(await postJson('/x', { b: 2 })).toEqual({ kind: 'ok', status: 200, body: { a: 1 } });
    const init = fetchMock.mock.calls[0][1]!;
    expect(init.method).toBe('POST');
    expect(init.body).toBe('{"b":2}');
    expect((init.headers as Record<string, string>)['content-type']).toBe('application/json');
  });

  it('sends no body and no content type when there is nothing to send, and takes a 204', async () => {
    fetchMock.mockResolvedValueOnce(new Response(null, { status: 204 }));
    expect(await postJson('/x')).toEqual({ kind: 'ok', status: 204, body: null });
    const init = fetchMock.mock.calls[0][1]!;
    expect(init.body).toBeUndefined();
    expect(init.headers as Record<string, string>).not.toHaveProperty('content-type');
  });

  it('answers a refusal with the code, message and Retry-After of our error shape', async () => {
    fetchMock.mockResolvedValueOnce(
      new Response('{"error":{"code":"rate_limited","message":"Too many."}}', { status: 429, headers: { 'retry-after': '900' } }),
    );
    expect(await postJson('/x', {})).toEqual({
      kind: 'refused',
      status: 429,
      code: 'rate_limited',
      message: 'Too many.',
      retryAfterSeconds: 900,
    });
  });

  it('answers a refusal without a message when the body is not our JSON', async () => {
    fetchMock.mockResolvedValueOnce(new Response('<h1>Bad gateway</h1>', { status: 502 }));
    expect(await postJson('/x', {})).toEqual({
      kind: 'refused',
      status: 502,
      code: undefined,
      message: undefined,
      retryAfterSeconds: undefined,
    });
  });

  it('tells no connection from no answer', async () => {
    fetchMock.mockRejectedValueOnce(new TypeError('Failed to fetch'));
    expect(await postJson('/x')).toEqual({ kind: 'offline' });

    vi.useFakeTimers();
    fetchMock.mockImplementationOnce(
      (_url, init) =>
        new Promise((_resolve, reject) => init?.signal?.addEventListener('abort', () => reject(new DOMException('aborted', 'AbortError')))),
    );
    const pending = postJson('/x', undefined, { timeoutMs: 500 });
    await vi.advanceTimersByTimeAsync(499);
    expect(fetchMock.mock.calls[1][1]?.signal?.aborted).toBe(false);
    await vi.advanceTimersByTimeAsync(1);
    expect(await pending).toEqual({ kind: 'timeout' });
  });
});
