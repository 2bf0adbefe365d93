// Lint rules, including the layering rules of DEVELOPERS.md written down once:
// core/ is pure TypeScript (no Node, Electron, Vue or DOM), nothing imports renderer/.
import js from '@eslint/js'
import tseslint from 'typescript-eslint'
import pluginVue from 'eslint-plugin-vue'
import globals from 'globals'

const nodeModules = ['node:*', 'fs', 'fs/*', 'path', 'os', 'child_process', 'worker_threads', 'url', 'util', 'crypto', 'stream']

export default tseslint.config(
  { ignores: ['dist/**', 'release/**', 'node_modules/**', 'bench/results/**', 'coverage/**', 'test-results/**', 'reports/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser }, globals: { ...globals.browser } },
  },
  {
    files: ['renderer/**/*.ts', 'renderer/**/*.vue'],
    languageOptions: { globals: { ...globals.browser } },
    rules: {
      // Type imports are erased at build: the window may name the IPC contract's types.
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: nodeModules, message: 'The renderer runs sandboxed: no Node modules; ask the preload bridge.' },
            { group: ['electron', '**/electron/**'], message: 'The renderer reaches Electron only through window.rodwave.', allowTypeImports: true },
          ],
        },
      ],
    },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    files: ['core/**/*.ts'],
    languageOptions: { globals: {} },
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: nodeModules, message: 'core/ is pure TypeScript: no Node modules (put file and process work in bin/ or electron/).' },
            { group: ['electron', 'vue', 'pinia', 'vue-echarts'], message: 'core/ knows nothing of the app frameworks.' },
            { group: ['**/renderer/**', '**/electron/**', '**/bin/**'], message: 'core/ imports neither front end.' },
          ],
        },
      ],
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'require', 'Buffer', '__dirname'],
    },
  },
  {
    files: ['bin/**/*.ts', 'bench/**/*.ts', 'tests/**/*.ts', '*.config.ts', '*.config.js'],
    languageOptions: { globals: { ...globals.node } },
  },
  {
    files: ['bin/**/*.ts', 'electron/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/renderer/**'], message: 'Nothing imports renderer/.' }] }],
    },
  },
)
