import type { MetadataRoute } from 'next';

// For a tablet that keeps the app on its home screen: our own name, mark and colours.
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: 'Proving Ground',
    short_name: 'Proving Ground',
    description: 'Guided fault isolation for direct spark ignition furnaces.',
    start_url: '/',
    display: 'standalone',
    background_color: '#14171a',
    theme_color: '#14171a',
    icons: [
      { src: '/icon-192.png', sizes: '192x192', type: 'image/png' },
      { src: '/icon-512.png', sizes: '512x512', type: 'image/png' },
      { src: '/icon.svg', sizes: 'any', type: 'image/svg+xml' },
    ],
  };
}
