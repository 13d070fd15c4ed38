// ESLint for the whole repository: typescript-eslint's recommended rules, the React hooks rules
// for the client, and no import cycles anywhere (import-x/no-cycle, resolving the @shared/* alias
// through tsconfig.json). `npm run lint`; `npm test` runs it before the suites.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.data/', 'tests/.output/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['**/*.{ts,tsx}'],
    ...importX.flatConfigs.typescript,
    settings: { ...importX.flatConfigs.typescript.settings, 'import-x/resolver-next': [createTypeScriptImportResolver({ project: 'tsconfig.json' })] },
    rules: { 'import-x/no-cycle': ['error', { ignoreExternal: true }] },
  },
  {
    // Outside shared/, shared folders that have a barrel are imported through it.
    files: ['backend/**/*.ts', 'frontend/src/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['@shared/analysis/*', '@shared/audit/*', '@shared/geometry/*', '@shared/kinematics/*', '@shared/safety/*'],
              message: 'Import shared code through its folder barrel (e.g. @shared/analysis, not @shared/analysis/reached).',
            },
            { group: ['**/../shared/*'], message: 'Use the @shared/* alias for shared code.' },
          ],
        },
      ],
    },
  },
  {
    files: ['frontend/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
);
