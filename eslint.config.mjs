// The lint gate (`npm run lint`, run by `npm test` before any suite). Flat config, typescript-eslint with type
// information for every TypeScript file of service, ui, shared-types, and for the scripts in bench/ and ops/.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import importX from 'eslint-plugin-import-x';
import jsxA11y from 'eslint-plugin-jsx-a11y';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const root = path.dirname(fileURLToPath(import.meta.url));
const modulesDir = 'service/src/modules';
const featureModules = readdirSync(path.join(root, modulesDir), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

/**
 * The module rule: a Nest feature module uses another only through that module's exported service (`*.service.ts`)
 * and its module class (`*.module.ts`, for the imports array); entities, helpers, guards and DTOs stay inside.
 * Shared shapes come from @crankjournal/shared-types, shared code from service/src/common and calculations.
 */
const moduleBoundaryZones = featureModules.map((name) => ({
  target: `${modulesDir}/${name}/**`,
  from: featureModules.filter((other) => other !== name).map((other) => `${modulesDir}/${other}/**`),
  except: featureModules
    .filter((other) => other !== name)
    .flatMap((other) => [`${modulesDir}/${other}/*.service.ts`, `${modulesDir}/${other}/*.module.ts`])
    // With glob zones the plugin matches exceptions against the absolute import path, so they must be absolute too.
    .map((pattern) => path.join(root, pattern)),
  message: 'A module uses another only through its exported service or module class (DEVELOPERS.md, "Module boundaries").',
}));

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '.data/**',
      'coverage/**',
      'ui/test-results/**',
      'ui/playwright-report/**',
      'bench/out/**',
      'samples/**',
      '**/*.cjs',
    ],
  },
  { linterOptions: { reportUnusedDisableDirectives: 'error' } },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      parserOptions: { projectService: { allowDefaultProject: ['eslint.config.mjs'] }, tsconfigRootDir: root },
    },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [
        createTypeScriptImportResolver({
          project: ['service/tsconfig.json', 'ui/tsconfig.json', 'ui/e2e/tsconfig.json', 'shared-types/tsconfig.json'],
        }),
      ],
    },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { attributes: false, arguments: false } }],
      '@typescript-eslint/await-thenable': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports', disallowTypeAnnotations: false }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true },
      ],
      'import-x/no-duplicates': ['error', { 'prefer-inline': true }],
      'import-x/order': [
        'error',
        {
          groups: ['builtin', 'external', 'internal', 'parent', 'sibling', 'index'],
          pathGroups: [{ pattern: '@crankjournal/**', group: 'internal' }],
          pathGroupsExcludedImportTypes: ['builtin'],
          'newlines-between': 'ignore',
          alphabetize: { order: 'ignore' },
        },
      ],
      'no-duplicate-imports': 'off',
      'max-len': ['error', { code: 140, ignoreUrls: true, ignoreStrings: true, ignoreTemplateLiterals: true, ignoreRegExpLiterals: true }],
    },
  },
  {
    files: ['service/**/*.ts'],
    languageOptions: { globals: globals.node },
    rules: {
      // Nest's DI reads parameter types at run time: a type-only import of an injected class would break it.
      '@typescript-eslint/consistent-type-imports': 'off',
    },
  },
  {
    files: [`${modulesDir}/**/*.ts`],
    rules: { 'import-x/no-restricted-paths': ['error', { zones: moduleBoundaryZones }] },
  },
  {
    files: ['ui/src/**/*.{ts,tsx}'],
    languageOptions: { globals: globals.browser },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  { ...jsxA11y.flatConfigs.recommended, files: ['ui/src/**/*.tsx'] },
  {
    files: ['ui/e2e/**/*.ts', 'ui/vite.config.ts', 'bench/**/*.mjs', 'ops/**/*.mjs', 'service/scripts/**/*.mjs', 'eslint.config.mjs'],
    languageOptions: { globals: globals.node },
  },
  {
    files: ['**/*.mjs'],
    rules: { '@typescript-eslint/consistent-type-imports': 'off' },
  },
  prettier,
  // Prettier leaves long strings and comments alone; the line-length limit still holds for them.
  { rules: { 'max-len': ['error', { code: 140, ignoreUrls: true, ignoreRegExpLiterals: true }] } },
  {
    // Migrations are generated SQL history and never edited after commit (DEVELOPERS.md), long lines and all.
    files: ['service/src/database/migrations/*.ts'],
    rules: { 'max-len': 'off' },
  },
  {
    // Generated from shared-types by service/scripts/shared-schemas.mjs; its descriptions are the doc comments as written.
    files: ['service/src/common/openapi/*.generated.ts'],
    rules: { 'max-len': 'off' },
  },
);
