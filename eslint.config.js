import js from '@eslint/js';
import globals from 'globals';
import boundaries from 'eslint-plugin-boundaries';
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

// The project's layers, enforced on every import: shared/ serves client, server and CLI and imports
// none of them; client features import no other feature (they meet in src/app); client-wide code
// imports no feature; server routes reach the database only through services.
const SERVER = ['server', 'server-routes', 'server-repositories'];
const CLIENT = ['feature', 'app', 'client'];

const layers = {
  plugins: { boundaries },
  settings: {
    'import/resolver': { typescript: { project: './tsconfig.json' } },
    'boundaries/include': ['shared/**/*', 'server/**/*', 'src/**/*'],
    'boundaries/elements': [
      { type: 'shared', pattern: 'shared/**', partialMatch: false },
      { type: 'server-routes', pattern: 'server/routes/**', partialMatch: false },
      { type: 'server-repositories', pattern: 'server/repositories/**', partialMatch: false },
      { type: 'server', pattern: 'server/**', partialMatch: false },
      { type: 'feature', pattern: 'src/features/*/**', partialMatch: false, capture: ['feature'] },
      { type: 'app', pattern: 'src/app/**', partialMatch: false },
      { type: 'client', pattern: 'src/{components,lib,config,workers,assets}/**', partialMatch: false },
    ],
  },
  rules: {
    'boundaries/dependencies': [
      2,
      {
        default: 'allow',
        policies: [
          {
            from: { element: { type: 'shared' } },
            disallow: { to: { element: { types: { anyOf: [...SERVER, ...CLIENT] } } } },
            message: 'shared/ is used by the client, the server and the CLI; it imports none of them',
          },
          {
            from: { element: { types: { anyOf: CLIENT } } },
            disallow: { to: { element: { types: { anyOf: SERVER } } } },
            message: 'the client talks to the server over HTTP only',
          },
          {
            from: { element: { type: 'feature' } },
            disallow: {
              to: {
                element: { type: 'feature', captured: { feature: '!{{ from.element.captured.feature }}' } },
              },
            },
            message: 'features do not import one another; compose them in src/app',
          },
          {
            from: { element: { type: 'client' } },
            disallow: { to: { element: { types: { anyOf: ['feature', 'app'] } } } },
            message: 'client-wide code (components, lib, config, workers) imports no feature and no app code',
          },
          {
            from: { element: { type: 'server-routes' } },
            disallow: { to: { element: { type: 'server-repositories' } } },
            message: 'routes call services; only services and their helpers use repositories',
          },
        ],
      },
    ],
  },
};

export default tseslint.config(
  { ignores: ['dist', 'data', 'node_modules', 'models', 'test-results', 'fixtures/generated', 'public'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
  { files: ['shared/**/*.ts', 'server/**/*.ts', 'src/**/*.{ts,tsx}'], ...layers },
);
