import { act, cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ThemeToggle } from '@/components/ui/theme-toggle';

const html = document.documentElement;

afterEach(() => {
  // Unmount first: the toggle follows <html>, and resetting it under a mounted toggle updates it outside the test.
  cleanup();
  html.classList.remove('dark');
  localStorage.clear();
});

describe('ThemeToggle', () => {
  it('starts from the theme already on <html>', () => {
    html.classList.add('dark');
    render(<ThemeToggle />);
    expect(screen.getByRole('button', { name: 'Use the light theme' })).toBeInTheDocument();
  });

  it('switches <html>, keeps the choice and relabels itself, both ways', async () => {
    const user = userEvent.setup();
    render(<ThemeToggle />);

    await user.click(screen.getByRole('button', { name: 'Use the dark theme' }));
    expect(html.classList.contains('dark')).toBe(true);
    expect(localStorage.getItem('pg-theme')).toBe('dark');
    expect(await screen.findByRole('button', { name: 'Use the light theme' })).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Use the light theme' }));
    expect(html.classList.contains('dark')).toBe(false);
    expect(localStorage.getItem('pg-theme')).toBe('light');
    expect(await screen.findByRole('button', { name: 'Use the dark theme' })).toBeInTheDocument();
  });

  it('follows a change of the theme made elsewhere on the page', async () => {
    render(<ThemeToggle />);
    await act(async () => {
      html.classList.add('dark');
    });
    expect(await screen.findByRole('button', { name: 'Use the light theme' })).toBeInTheDocument();
  });
});
