// Lint: typescript-eslint's recommended rules, React hooks, and the boundaries the layout depends on.
// The boundaries are written as import restrictions per folder, so a wrong import fails `npm test`.
import js from '@eslint/js'
import reactHooks from 'eslint-plugin-react-hooks'
import globals from 'globals'
import tseslint from 'typescript-eslint'

const restrict = (patterns) => ({ 'no-restricted-imports': ['error', { patterns }] })

const FEATURES = ['admin', 'auth', 'home', 'notices', 'planner', 'requests', 'search', 'studios']

export default tseslint.config(
  { ignores: ['dist/**', 'var/**', 'node_modules/**', 'public/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-namespace': 'off',
      'no-control-regex': 'off',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  // shared/ is isomorphic: it imports nothing from the server, the client or the search folder.
  {
    files: ['shared/**/*.ts'],
    rules: restrict([
      { regex: '^(\\.\\./)+(server|src|search)/', message: 'shared/ imports only shared/ and packages.' },
      { group: ['typeorm', 'express', 'react', 'react-dom'], message: 'shared/ stays free of server and client frameworks.' },
    ]),
  },
  // search/ depends on shared/ and on what the server hands it; never on the server itself.
  {
    files: ['search/**/*.ts'],
    rules: restrict([
      { regex: '^(\\.\\./)+(server|src)/', message: 'search/ takes what it needs from its caller; it does not import the server.' },
    ]),
  },
  // The stand-ins play outside services: they share nothing with the app.
  {
    files: ['standins/**/*.ts'],
    rules: restrict([
      {
        regex: '^(\\.\\./)+(server|src|search|shared)/',
        message: 'A stand-in speaks the outside service’s API; it imports nothing of the app.',
      },
    ]),
  },
  // The server reaches search/ through its public entry only.
  {
    files: ['server/**/*.ts'],
    ignores: ['server/routes/**'],
    rules: restrict([
      {
        regex: '^(\\.\\./)+search/(?!public$)',
        message: 'Import search/public, the search folder’s one entry.',
      },
      { regex: '^(\\.\\./)+src/', message: 'The server does not import the client.' },
    ]),
  },
  // Routes translate HTTP to service calls: no entities, no ORM.
  {
    files: ['server/routes/**/*.ts'],
    rules: restrict([
      { group: ['**/entities/**', 'typeorm'], message: 'Routes call services; entities and the ORM stay in services.' },
      { regex: '^(\\.\\./)+search/(?!public$)', message: 'Import search/public, the search folder’s one entry.' },
    ]),
  },
  // The client imports shared/ and its own code; features do not import each other (the app composes them).
  {
    files: ['src/**/*.{ts,tsx}'],
    ignores: ['src/app/**', 'src/features/**'],
    rules: restrict([
      { regex: '^(\\.\\./)+(server|search)/', message: 'The client talks to the server over HTTP only.' },
      { group: ['**/features/**'], message: 'Shared client code does not depend on a feature.' },
    ]),
  },
  ...FEATURES.map((feature) => ({
    files: [`src/features/${feature}/**/*.{ts,tsx}`],
    rules: restrict([
      { regex: '^(\\.\\./)+(server|search)/', message: 'The client talks to the server over HTTP only.' },
      {
        group: FEATURES.filter((f) => f !== feature).map((f) => `**/features/${f}/**`),
        message: 'Features do not import each other; compose them in src/app or move the shared part to src/components or src/lib.',
      },
    ]),
  })),
  {
    files: ['src/app/**/*.{ts,tsx}'],
    rules: restrict([{ regex: '^(\\.\\./)+(server|search)/', message: 'The client talks to the server over HTTP only.' }]),
  },
  // Text reaches the API through shared/schemas/text.ts only, which refuses NUL and broken surrogates.
  // payments.ts and payouts.ts read events already signed by Stripe (their own shape checks), not text from people.
  {
    files: ['shared/**/*.ts', 'server/**/*.ts'],
    ignores: ['server/services/payments.ts', 'server/services/payouts.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "CallExpression[callee.object.name='z'][callee.property.name='string']",
          message: 'Use text() from shared/schemas/text.ts: it refuses NUL and unpaired surrogates.',
        },
        {
          selector: "CallExpression[callee.object.object.name='z'][callee.object.property.name='coerce'][callee.property.name='string']",
          message: 'Use text() from shared/schemas/text.ts: it refuses NUL and unpaired surrogates.',
        },
      ],
    },
  },
  {
    files: ['tests/**/*.ts', 'bench/**/*.ts', 'scripts/**/*.mjs'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
)
