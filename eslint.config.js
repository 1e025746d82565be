// Lint rules, including STYLE.md's one-way imports: features never import each other; the client
// never imports server code; the engine imports nothing from the server around it.
import js from '@eslint/js';
import importPlugin from 'eslint-plugin-import';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const featureZones = ['auth', 'workspaces', 'members', 'datasets', 'models', 'fits', 'reviews', 'releases', 'dev'].map(
  (feature) => ({
    target: `./src/features/${feature}`,
    from: './src/features',
    except: [`./${feature}`],
    message: 'Features do not import each other; compose them at the app level (src/app).',
  }),
);

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.lariat/**', 'bench/out/**', 'datasets/**/*.py', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: { ...globals.node, ...globals.browser },
    },
    plugins: { import: importPlugin },
    settings: { 'import/resolver': { typescript: { project: './tsconfig.json' }, node: { extensions: ['.ts', '.tsx', '.js'] } } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'import/no-cycle': ['error', { ignoreExternal: true }],
      'import/no-restricted-paths': [
        'error',
        {
          zones: [
            ...featureZones,
            { target: './src', from: './server', message: 'The client talks to the server over HTTP only.' },
            { target: './shared', from: './server', message: 'shared/ is used by both sides; it cannot depend on the server.' },
            { target: './shared', from: './src', message: 'shared/ is used by both sides; it cannot depend on the client.' },
            { target: './server/engine', from: './server', except: ['./engine'], message: 'The engine has no I/O and depends on nothing around it.' },
            { target: './server', from: './src', message: 'The server never imports client code.' },
          ],
        },
      ],
    },
  },
  {
    // server/engine is pure functions on arrays (README, docs/decisions/0017-no-io-in-engine.md): no file, thread,
    // process or network access. Reading files lives in server/tabular, threads in server/engine-runner.
    files: ['server/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '^(node:)?(fs|fs/promises|worker_threads|child_process|cluster|net|http|https|http2|dgram|dns|tls|readline|module|os|process|stream|inspector|v8|vm)(/.*)?$',
              message: 'The engine does no I/O: read data in server/tabular, run threads in server/engine-runner.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
);
