// Lint rules that keep the architecture visible (see DEVELOPERS.md): dependencies flow
// lib → db → features → app, features do not import each other, and no Drizzle update or
// delete runs without a where clause.
import { readdirSync, existsSync } from 'node:fs';
import tseslint from 'typescript-eslint';
import importX from 'eslint-plugin-import-x';
import drizzle from 'eslint-plugin-drizzle';
import reactHooks from 'eslint-plugin-react-hooks';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';

const featureNames = existsSync('features')
  ? readdirSync('features', { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name)
  : [];

const zones = [
  { target: './lib', from: ['./features', './app', './db'], message: 'lib/ is pure: it imports nothing from db/, features/ or app/.' },
  { target: './db', from: ['./features', './app'], message: 'db/ is shared: it imports nothing from features/ or app/.' },
  { target: './features', from: './app', message: 'features/ never import app/.' },
  // Features do not import each other. The only shared pieces are the server-side guard and its
  // typed errors (features/auth/guard.ts, errors.ts), the mail sender (features/mail) and the UI kit
  // (features/ui): infrastructure every capability needs, documented in DEVELOPERS.md.
  ...featureNames.map((name) => ({
    target: `./features/${name}`,
    from: './features',
    except: [...new Set([`./${name}`, './ui', './mail', './auth/guard.ts', './auth/errors.ts'])],
    message: 'Features do not import each other; move shared code to lib/ or db/.',
  })),
];

export default tseslint.config(
  { ignores: ['node_modules/**', '.next*/**', '.data/**', 'drizzle/**', 'test-results/**', 'playwright-report/**', 'next-env.d.ts'] },
  {
    files: ['**/*.{ts,tsx,mts,mjs}'],
    languageOptions: { parser: tseslint.parser, parserOptions: { ecmaFeatures: { jsx: true } } },
    plugins: { 'import-x': importX, drizzle, 'react-hooks': reactHooks },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
    },
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['../*', '../../*', '../../../*'], message: 'Use the @/ alias instead of parent-relative imports.' }] },
      ],
      'import-x/no-restricted-paths': ['error', { zones }],
      'drizzle/enforce-delete-with-where': ['error', { drizzleObjectName: ['db', 'tx'] }],
      'drizzle/enforce-update-with-where': ['error', { drizzleObjectName: ['db', 'tx'] }],
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    // The engine, units, parts and bench code run in the browser too: no Node built-ins, no server-only modules.
    files: ['lib/engine/**/*.ts', 'lib/units/**/*.ts', 'lib/parts/**/*.ts', 'lib/bench/**/*.ts', 'lib/cautions.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['node:*', 'fs', 'path', 'child_process', 'crypto', 'os'], message: 'lib/ runs in the browser too: no Node built-ins.' },
            { group: ['react', 'react-dom', 'next', 'next/*', 'server-only', 'drizzle-orm', 'drizzle-orm/*', 'mysql2', 'mysql2/*'], message: 'lib/ is pure computation.' },
            { group: ['../*', '../../*', '../../../*'], message: 'Use the @/ alias instead of parent-relative imports.' },
          ],
        },
      ],
    },
  },
);
