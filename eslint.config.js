// Lint rules: typescript-eslint's recommended set plus the layer rule of ARCHITECTURE.md
// (each layer imports only the layers below it).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

/** Which folders under src/ each layer must not import from. */
const forbidden = {
  quantum: ['expr', 'model', 'engine', 'session', 'sweep', 'report', 'tui', 'cli'],
  expr: ['quantum', 'model', 'engine', 'session', 'sweep', 'report', 'tui', 'cli'],
  model: ['engine', 'session', 'sweep', 'report', 'tui', 'cli'],
  engine: ['session', 'sweep', 'report', 'tui', 'cli'],
  session: ['sweep', 'report', 'tui', 'cli'],
  // sweep and report sit side by side above session; cli joins them
  sweep: ['report', 'tui', 'cli'],
  report: ['sweep', 'tui', 'cli'],
  tui: ['sweep', 'cli'],
  // the library's face (src/index.ts re-exports it); cli builds on it
  api: ['report', 'tui', 'cli'],
};

const layerRules = Object.entries(forbidden).map(([layer, banned]) => ({
  files: [`src/${layer}/**/*.ts`, `src/${layer}/**/*.tsx`],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: banned.map((b) => ({
          group: [`../${b}/*`, `../../${b}/*`, `../${b}`, `../../${b}`],
          message: `${layer}/ must not import ${b}/ (ARCHITECTURE.md: imports only go downwards).`,
        })),
      },
    ],
  },
}));

export default tseslint.config(
  { ignores: ['dist/**', 'dist-bench/**', 'node_modules/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-eval': 'error',
      'no-new-func': 'error',
    },
  },
  {
    files: ['src/tui/**/*.tsx', 'src/tui/**/*.ts'],
    rules: {},
  },
  ...layerRules,
);
