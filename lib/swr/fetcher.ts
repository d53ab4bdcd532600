/** An API error with the server's message, so the UI can show it and offer a retry. */
export class FetchError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code?: string,
  ) {
    super(message);
    this.name = 'FetchError';
  }
}

/** The shared SWR fetcher: JSON from our route handlers, throwing on any non-2xx answer. */
export async function fetcher<T = unknown>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: 'application/json' }, credentials: 'same-origin' });
  if (!res.ok) {
    let message = `The server answered ${res.status}.`;
    let code: string | undefined;
    try {
      const body = await res.json();
      if (body?.error?.message) message = body.error.message;
      code = body?.error?.code;
    } catch {
      // Not JSON (a proxy page, a crash): keep the status message.
    }
    throw new FetchError(message, res.status, code);
  }
  return res.json() as Promise<T>;
}
