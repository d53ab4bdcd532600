import { act, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SignInForm } from '@/components/auth/sign-in-form';

const router = { replace: vi.fn(), refresh: vi.fn(), push: vi.fn(), back: vi.fn(), forward: vi.fn(), prefetch: vi.fn() };
vi.mock('next/navigation', () => ({ useRouter: () => router }));

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  fetchMock.mockReset();
  for (const fn of Object.values(router)) fn.mockReset();
});

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

const json = (status: number, body: unknown, headers: Record<string, string> = {}) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json', ...headers } });

/** A fetch that never answers, and rejects the way a browser does once its signal is aborted. */
function hangingFetch(init?: RequestInit): ReturnType<typeof fetch> {
  return new Promise((_resolve, reject) => {
    init?.signal?.addEventListener('abort', () => reject(new DOMException('The operation was aborted.', 'AbortError')));
  });
}

async function submit(user: ReturnType<typeof userEvent.setup>, email = 'lead@demo.test', password = 'x') {
  await user.type(screen.getByLabelText('E-mail'), email);
  await user.type(screen.getByLabelText('Password'), password);
  await user.click(screen.getByRole('button', { name: 'Sign in' }));
}

describe('SignInForm', () => {
  it('shows a field error under each empty field and sends nothing', async () => {
    const user = userEvent.setup();
    render(<SignInForm />);
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    const email = screen.getByLabelText('E-mail');
    const password = screen.getByLabelText('Password');
    await waitFor(() => expect(email).toHaveAttribute('aria-invalid', 'true'));
    expect(password).toHaveAttribute('aria-invalid', 'true');
    expect(email).toHaveAccessibleDescription(/Enter a valid e-mail address\./);
    expect(password).toHaveAccessibleDescription(/Enter your password\./);
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the message the API answers with, and stays on the page', async () => {
    const message = 'That e-mail and password do not match an active account.';
    fetchMock.mockResolvedValueOnce(json(401, { error: { code: 'unauthorized', message } }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await user.type(screen.getByLabelText('E-mail'), 'Lead@Demo.test');
    await user.type(screen.getByLabelText('Password'), 'not-the-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('alert')).toHaveTextContent(message);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/auth/sign-in');
    expect(init?.method).toBe('POST');
    // The schema normalises the e-mail before it is sent.
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'lead@demo.test', password: 'not-the-password' });
    expect(router.replace).not.toHaveBeenCalled();
  });

  it('shows the rate-limit message on 429', async () => {
    const message = 'Too many failed sign-ins. Try again in 15 minute(s).';
    fetchMock.mockResolvedValueOnce(json(429, { error: { code: 'rate_limited', message } }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await user.type(screen.getByLabelText('E-mail'), 'lead@demo.test');
    await user.type(screen.getByLabelText('Password'), 'x');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(message);
  });

  it('says the server could not be reached when fetch fails', async () => {
    fetchMock.mockRejectedValueOnce(new TypeError('network down'));
    const user = userEvent.setup();
    render(<SignInForm />);
    await user.type(screen.getByLabelText('E-mail'), 'lead@demo.test');
    await user.type(screen.getByLabelText('Password'), 'x');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(/could not be reached/);
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
  });

  it('gives up after 15 s without an answer, says so, and offers the button again', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    fetchMock.mockImplementationOnce((_url, init) => hangingFetch(init));
    const user = userEvent.setup({ advanceTimers: vi.advanceTimersByTime });
    render(<SignInForm />);
    await submit(user);
    expect(await screen.findByRole('button', { name: 'Signing in…' })).toBeDisabled();
    const signal = fetchMock.mock.calls[0][1]?.signal;
    expect(signal).toBeInstanceOf(AbortSignal);

    await act(async () => {
      await vi.advanceTimersByTimeAsync(14_000);
    });
    expect(signal?.aborted).toBe(false);
    expect(screen.getByRole('button', { name: 'Signing in…' })).toBeDisabled();
    expect(screen.getByRole('alert')).toHaveTextContent('');

    await act(async () => {
      await vi.advanceTimersByTimeAsync(1_100);
    });
    expect(signal?.aborted).toBe(true);
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'The server did not answer. Check the connection and try again; nothing was changed.',
    );
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
    expect(router.replace).not.toHaveBeenCalled();
  });

  it('also gives up when the answer starts but its body never finishes', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    fetchMock.mockImplementationOnce(async (_url, init) => {
      const body = new ReadableStream({
        start(controller) {
          init?.signal?.addEventListener('abort', () => controller.error(new DOMException('aborted', 'AbortError')));
        },
      });
      return new Response(body, { status: 200, headers: { 'content-type': 'application/json' } });
    });
    const user = userEvent.setup({ advanceTimers: vi.advanceTimersByTime });
    render(<SignInForm />);
    await submit(user);
    await act(async () => {
      await vi.advanceTimersByTimeAsync(15_100);
    });
    expect(await screen.findByRole('alert')).toHaveTextContent(/did not answer/);
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
    expect(router.replace).not.toHaveBeenCalled();
  });

  it('shows the busy message of a 503 with its Retry-After in words', async () => {
    const message = 'The server is busy. Nothing was changed; try again in a moment.';
    fetchMock.mockResolvedValueOnce(json(503, { error: { code: 'unavailable', message } }, { 'retry-after': '120' }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await submit(user);
    expect(await screen.findByRole('alert')).toHaveTextContent(`${message} Try again in 2 minutes.`);
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
  });

  it('shows the busy message of a 503 alone when it has no Retry-After', async () => {
    const message = 'The server is busy. Nothing was changed; try again in a moment.';
    fetchMock.mockResolvedValueOnce(json(503, { error: { code: 'unavailable', message } }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await submit(user);
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent(message);
    expect(alert).not.toHaveTextContent(/Try again in/);
  });

  it('says the server is not available for a 503 page that is not our JSON', async () => {
    fetchMock.mockResolvedValueOnce(new Response('<html>Service Unavailable</html>', { status: 503, headers: { 'retry-after': '1' } }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await submit(user);
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'The server is not available right now. Nothing was changed. Try again in 1 second.',
    );
  });

  it('names the status of an answer without a message', async () => {
    fetchMock.mockResolvedValueOnce(new Response('', { status: 502 }));
    const user = userEvent.setup();
    render(<SignInForm />);
    await submit(user);
    expect(await screen.findByRole('alert')).toHaveTextContent('Sign-in failed (the server answered 502). Try again.');
  });

  it('goes home after a successful sign-in', async () => {
    fetchMock.mockResolvedValueOnce(
      json(200, { id: 'x', email: 'lead@demo.test', name: 'L', role: 'lead', company: { id: 'c', name: 'C' } }),
    );
    const user = userEvent.setup();
    render(<SignInForm />);
    await user.type(screen.getByLabelText('E-mail'), 'lead@demo.test');
    await user.type(screen.getByLabelText('Password'), 'demo-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.replace).toHaveBeenCalledWith('/'));
    expect(screen.getByRole('alert')).toHaveTextContent('');
  });
});
