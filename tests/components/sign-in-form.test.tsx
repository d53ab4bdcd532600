import { render, screen, waitFor } from '@testing-library/react';
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
  vi.unstubAllGlobals();
});

const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

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
