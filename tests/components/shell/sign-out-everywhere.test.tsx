import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SignOutButton } from '@/components/shell/sign-out-button';
import { SignOutEverywhere } from '@/components/shell/sign-out-everywhere';

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

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

describe('SignOutEverywhere', () => {
  it('asks first and sends nothing until confirmed; Cancel puts the control back', async () => {
    const user = userEvent.setup();
    render(<SignOutEverywhere />);
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    const dialog = screen.getByRole('alertdialog', { name: 'Sign out on every device?' });
    expect(dialog).toHaveAccessibleDescription(/Every session of yours ends/);
    // The safe choice has the focus, so a stray Enter does not sign everyone out.
    expect(screen.getByRole('button', { name: 'Cancel' })).toHaveFocus();
    expect(fetchMock).not.toHaveBeenCalled();

    await user.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(screen.queryByRole('alertdialog')).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign out everywhere' })).toHaveFocus();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('closes on Escape without sending anything', async () => {
    const user = userEvent.setup();
    render(<SignOutEverywhere />);
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('alertdialog')).not.toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('posts to sign-out-everywhere once confirmed and goes to sign-in on 204', async () => {
    fetchMock.mockResolvedValueOnce(new Response(null, { status: 204 }));
    const user = userEvent.setup();
    render(<SignOutEverywhere />);
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    await waitFor(() => expect(router.replace).toHaveBeenCalledWith('/sign-in'));
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(fetchMock.mock.calls[0][0]).toBe('/api/auth/sign-out-everywhere');
    expect(fetchMock.mock.calls[0][1]?.method).toBe('POST');
  });

  it('stays and says the sessions were not ended when the server refuses', async () => {
    fetchMock.mockResolvedValueOnce(json(503, { error: { code: 'unavailable', message: 'The server is busy.' } }));
    const user = userEvent.setup();
    render(<SignOutEverywhere />);
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('The server is busy. Your sessions were not ended.');
    expect(router.replace).not.toHaveBeenCalled();
    expect(screen.getByRole('button', { name: 'Sign out everywhere' })).toBeEnabled();
  });

  it('does not claim success when the server does not answer within 15 s', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    fetchMock.mockImplementationOnce(
      (_url, init) =>
        new Promise((_resolve, reject) => init?.signal?.addEventListener('abort', () => reject(new DOMException('aborted', 'AbortError')))),
    );
    const user = userEvent.setup({ advanceTimers: vi.advanceTimersByTime });
    render(<SignOutEverywhere />);
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    await user.click(screen.getByRole('button', { name: 'Sign out everywhere' }));
    expect(screen.getByRole('button', { name: 'Signing out…' })).toBeDisabled();
    await vi.advanceTimersByTimeAsync(15_100);
    expect(await screen.findByRole('alert')).toHaveTextContent(/did not answer, so your other sessions may still be open/);
    expect(router.replace).not.toHaveBeenCalled();
  });
});

describe('SignOutButton', () => {
  it('goes to sign-in once the server has ended the session (204), or had already (401)', async () => {
    const user = userEvent.setup();
    fetchMock.mockResolvedValueOnce(new Response(null, { status: 204 }));
    const { unmount } = render(<SignOutButton />);
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(router.replace).toHaveBeenCalledWith('/sign-in'));
    expect(fetchMock.mock.calls[0][0]).toBe('/api/auth/sign-out');
    unmount();

    router.replace.mockReset();
    fetchMock.mockResolvedValueOnce(json(401, { error: { code: 'unauthorized', message: 'Sign in to continue.' } }));
    render(<SignOutButton />);
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(router.replace).toHaveBeenCalledWith('/sign-in'));
  });

  it('stays and says so when the sign-out did not reach the server', async () => {
    fetchMock.mockRejectedValueOnce(new TypeError('Failed to fetch'));
    const user = userEvent.setup();
    render(<SignOutButton />);
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    expect(await screen.findByRole('button', { name: 'Sign out again' })).toBeEnabled();
    expect(screen.getByRole('alert')).toHaveTextContent(/still signed in/);
    expect(router.replace).not.toHaveBeenCalled();
  });
});
