import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';
import prettier from 'eslint-config-prettier';

// Next.js's own rules (with React, the hooks rules and accessibility), its TypeScript rules, and
// Prettier last so that formatting is Prettier's alone.
const config = [
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      // `_name` marks a value left out on purpose (a rest destructure that drops a field).
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true }],
    },
  },
  {
    // The HTTP and browser tests are black-box: they read the API's JSON answers untyped and check each
    // field with expect, on purpose without borrowing the server's types, which they are there to check.
    files: ['tests/e2e/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // CommonJS on purpose: preloaded into the server with `node --require` (scripts/http-guard.cjs).
    files: ['**/*.cjs'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    // CommonJS files (a `node --require` preload must be one) import with require().
    files: ['**/*.cjs'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  prettier,
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
