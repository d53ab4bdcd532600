import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';
import prettier from 'eslint-config-prettier';

// Next.js's own rules (with React, the hooks rules and accessibility), its TypeScript rules, and
// Prettier last so that formatting is Prettier's alone.
const config = [
  ...nextVitals,
  ...nextTs,
  prettier,
  {
    rules: {
      // `_name` marks a value left out on purpose (a rest destructure that drops a field).
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true }],
    },
  },
  {
    // Tests build fixtures loosely typed from JSON answers.
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // Build output and data: the app's build folders (.next-* are side builds, see DEVELOPERS.md), the
    // database cluster, and the bench's results and floor-app builds.
    ignores: [
      'node_modules/**',
      '.next/**',
      '.next-*/**',
      '.data/**',
      'bench/out/**',
      'bench/floor/.next*/**',
      '**/next-env.d.ts',
      'tsconfig.tsbuildinfo',
    ],
  },
];

export default config;
