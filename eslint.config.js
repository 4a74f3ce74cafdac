import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import fs from 'node:fs';

/*
 * The direction of dependencies (DEVELOPERS.md, "Layers"): the pure layers below the areas —
 * lib (plain helpers), physics (numerics only), reliability (life statistics) and db (the
 * connection, models, migrations) — never import an area or anything above them; client
 * features never import each other, and the client's shared lib and components import no feature.
 */
const rule = (files, ...patterns) => ({ files, rules: { 'no-restricted-imports': ['error', { patterns }] } });
const noServer = { group: ['**/server/**'], message: 'The client imports from the server only its contracts, as @contracts/*.' };
const noClient = { group: ['**/web/src/*', '@/*'], message: 'The server never imports the client.' };
// relative paths out of a folder, except into the layers it may use (ESLint's glob groups cannot match `../`);
// a later block replaces the rule of an earlier one for the same file, so each block repeats `noClient`
const up = (regex, message) => ({ regex, message });
const features = fs.readdirSync('web/src/features', { withFileTypes: true }).filter((d) => d.isDirectory()).map((d) => d.name);
const layerRules = [
  rule(['server/**/*.ts', 'jobs/**/*.ts'], noClient),
  rule(['server/*/**/*.ts'], noClient, up('^(\\.\\./){2,}jobs/', 'An area does not import the jobs (they import the areas); take what it needs as a dependency from server/main.ts.')),
  rule(['server/lib/**/*.ts'], noClient, up('^\\.\\./', 'server/lib is the bottom layer: it imports only packages and node built-ins.')),
  // contracts import nothing but zod, so the pure layers may take the shapes they share with the client from them
  rule(['server/physics/**/*.ts'], noClient, up('^\\.\\./(?!lib/|contracts/)', 'server/physics is pure numerics: it imports only server/lib and the contracts.')),
  rule(['server/reliability/**/*.ts'], noClient, up('^\\.\\./(?!lib/|physics/|contracts/)', 'server/reliability imports only server/lib, server/physics and the contracts.')),
  rule(['server/db/*.ts'], noClient, up('^\\.\\./(?!lib/|physics/|contracts/|config$|logger$)', 'server/db imports no area (an area imports db, never the other way).')),
  rule(['server/db/models/*.ts'], noClient, up('^\\.\\./\\.\\./(?!contracts/)', 'The models import no area (an area imports db, never the other way).')),
  rule(['server/contracts/**/*.ts'], noClient, up('^\\.\\./', 'server/contracts is shared with the client: it imports nothing but zod and its own files.')),
  rule(['server/db/migrations/*.ts'], noClient, up('^\\.\\./\\.\\./', 'A migration stands alone: it imports no application code, which may change after it ran.')),
  rule(['web/src/**/*.{ts,tsx}'], noServer),
  rule(['web/src/lib/**/*.{ts,tsx}', 'web/src/components/**/*.{ts,tsx}'], { group: ['@/features/*', '**/features/*', '@/app/*', '**/app/*'], message: 'Shared client code imports no feature and not the app.' }, noServer),
  ...features.map((f) =>
    rule([`web/src/features/${f}/**/*.{ts,tsx}`], {
      group: ['@/features/*', `!@/features/${f}`, `!@/features/${f}/**`, '@/app/*'],
      message: 'A feature imports no other feature and not the app: share through web/src/lib or components, or compose in web/src/app.',
    }, noServer),
  ),
];

export default tseslint.config(
  { ignores: ['dist/', 'data/', 'node_modules/', 'coverage/', 'reports/', '.stryker-tmp/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  ...layerRules,
  {
    files: ['web/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    // every query key starts from a root in web/src/lib/query-keys.ts, so one feature can make
    // another's data stale without importing it or spelling its key
    files: ['web/src/**/*.{ts,tsx}'],
    ignores: ['web/src/lib/query-keys.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "Property[key.name=/^(queryKey|all)$/] > ArrayExpression > Literal:first-child",
          message: 'Start query keys from queryRoots (web/src/lib/query-keys.ts), not a literal.',
        },
        {
          selector: "Property[key.name=/^(queryKey|all)$/] > TSAsExpression > ArrayExpression > Literal:first-child",
          message: 'Start query keys from queryRoots (web/src/lib/query-keys.ts), not a literal.',
        },
        {
          selector: "ArrowFunctionExpression > TSAsExpression > ArrayExpression > Literal:first-child",
          message: 'Start query keys from queryRoots (web/src/lib/query-keys.ts), not a literal.',
        },
      ],
    },
  },
);
