import type { Metadata, Viewport } from 'next';
import clsx from 'clsx';
import { headers } from 'next/headers';
import { mono, sans } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Proving Ground', template: '%s · Proving Ground' },
  description: 'Guided fault isolation for direct spark ignition furnaces.',
};

export const viewport: Viewport = {
  width: 'device-width',
  initialScale: 1,
  themeColor: [
    { media: '(prefers-color-scheme: light)', color: '#f4f5f6' },
    { media: '(prefers-color-scheme: dark)', color: '#14171a' },
  ],
};

// Sets the theme class before the first paint so a dark basement never sees a white flash.
const themeScript = `try{var t=localStorage.getItem('pg-theme');if(t==='dark'||(!t&&matchMedia('(prefers-color-scheme: dark)').matches))document.documentElement.classList.add('dark')}catch(e){}`;

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // The Content-Security-Policy's nonce for this request (proxy.ts), so the theme script may run.
  const nonce = (await headers()).get('x-nonce') ?? undefined;
  return (
    <html lang="en" className={clsx(sans.variable, mono.variable)} suppressHydrationWarning>
      <head>
        <script nonce={nonce} dangerouslySetInnerHTML={{ __html: themeScript }} />
      </head>
      <body className="min-h-dvh">{children}</body>
    </html>
  );
}
