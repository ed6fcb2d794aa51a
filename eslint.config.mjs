// Lint and format in one tool: the Nuxt flat config with ESLint's stylistic rules as the
// formatter (no second formatter to keep in step). The standalone config is used rather
// than the module's generated one so `npx eslint .` works on a fresh clone without `.nuxt/`.
import { createConfigForNuxt } from '@nuxt/eslint-config/flat'
import { createNodeResolver } from 'eslint-plugin-import-x'

// eslint-flat-config-utils calls Object.groupBy (Node 21+); we run on Node 20.
Object.groupBy ??= (items, keyOf) => {
  const groups = Object.create(null)
  items.forEach((item, index) => (groups[keyOf(item, index)] ??= []).push(item))
  return groups
}

export default createConfigForNuxt({
  features: {
    stylistic: { indent: 2, quotes: 'single', semi: false, commaDangle: 'always-multiline', braceStyle: '1tbs', arrowParens: true },
    tooling: false,
  },
})
  .append({
    name: 'slakewise/ignores',
    ignores: ['server/db/migrations/**', 'test-results/**', '.data/**', 'tests/fixtures/**'],
  })
  .append({
    name: 'slakewise/house-rules',
    settings: {
      'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.mjs', '.js', '.vue'] })],
    },
    rules: {
      // Module cycles made the batch/record services hard to follow once; keep them out.
      'import/no-cycle': ['error', { ignoreExternal: true }],
      '@stylistic/max-len': ['error', {
        code: 160, tabWidth: 2, ignoreUrls: true, ignoreStrings: true, ignoreTemplateLiterals: true, ignoreRegExpLiterals: true,
      }],
      // Demo data belongs to the seed; nothing else may read it.
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/db/demo/**', '**/db/demo'], message: 'Demo data is for the seed only (server/db/demo, scripts/seed.ts).' }] }],
      'vue/multi-word-component-names': 'off',
      // Props carry SI unit suffixes like the engine (temperWithin_s), not camelCase alone.
      'vue/prop-name-casing': 'off',
      // Short templates read better on one line; long ones are caught by max-len.
      'vue/max-attributes-per-line': 'off',
      // Grouped by concern (modules, app, auth, runtime), not alphabetically.
      'nuxt/nuxt-config-keys-order': 'off',
      // The house style as written: void elements self-closed, `;` between members of a
      // one-line type literal, a line break after binary operators and before `?`, `:` and type unions.
      'vue/html-self-closing': ['error', { html: { void: 'always', normal: 'always', component: 'always' }, svg: 'always', math: 'always' }],
      '@stylistic/member-delimiter-style': ['error', {
        multiline: { delimiter: 'none', requireLast: false },
        singleline: { delimiter: 'semi', requireLast: false },
      }],
      '@stylistic/operator-linebreak': ['error', 'after', { overrides: { '?': 'before', ':': 'before', '|': 'before', '&': 'before' } }],
      'vue/singleline-html-element-content-newline': 'off',
    },
  })
  .append({
    name: 'slakewise/tests',
    files: ['tests/**'],
    // Tests read loosely typed JSON responses and build deliberately malformed inputs.
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  })
  .append({
    name: 'slakewise/seed-may-read-demo',
    files: ['server/db/demo/**', 'scripts/seed.ts', 'scripts/demo-sign-ins.ts', 'tests/**', 'scripts/bench/**', 'scripts/bench-*.ts', 'scripts/test-cluster.ts'],
    rules: { 'no-restricted-imports': 'off' },
  })
