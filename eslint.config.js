import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import { readdirSync } from 'node:fs';

/**
 * Features never import one another (src/features/a → src/features/b): what two features share
 * moves to src/components, src/lib or shared/, and pages (src/app/routes) compose features.
 * One rule per feature folder, so a new feature is covered as soon as its folder exists.
 */
const features = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const noCrossFeatureImports = features.map((feature) => ({
  files: [`src/features/${feature}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: [
          {
            group: ['@/features/*', `!@/features/${feature}`, `!@/features/${feature}/**`, '../../*/**', `!../../${feature}/**`, '../../../*/**', `!../../../${feature}/**`],
            message: `src/features/${feature} may not import another feature: move what both need to src/components, src/lib or shared/, or compose them in a page under src/app/routes.`,
          },
        ],
      },
    ],
  },
}));

export default tseslint.config(
  { ignores: ['dist', 'node_modules', '.data', 'drizzle', 'test-results', 'bench-results'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-namespace': 'off',
    },
  },
  {
    files: ['src/**/*.tsx', 'src/**/*.ts'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/server/**', '**/src/**', '@/*'], message: 'shared/ runs in browser and server: it must not import from server/ or src/.' }] }],
    },
  },
  {
    // Every string a client can send goes through one schema that refuses NUL and broken Unicode.
    files: ['shared/**/*.ts', 'server/routes/**/*.ts'],
    ignores: ['shared/contracts/text.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "CallExpression[callee.property.name='string']:matches([callee.object.name='z'], [callee.object.property.name='coerce'])",
          message: 'Use text() from shared/contracts/text.ts (it refuses NUL and unpaired surrogates); chain .trim(), .max(), .uuid() … on it.',
        },
      ],
    },
  },
  ...noCrossFeatureImports,
);
