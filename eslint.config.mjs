// Lint configuration: typescript-eslint on strict TypeScript plus the Jupyter
// extension rules (plugin descriptions, command ids, translation hygiene).
import tseslint from 'typescript-eslint';
import jupyter from '@jupyter/eslint-plugin';
import globals from 'globals';

const jupyterRecommended = Array.isArray(jupyter.configs.recommended)
  ? jupyter.configs.recommended
  : [jupyter.configs.recommended];

// src/core is pure: no DOM, no JupyterLab, no Lumino, no charts or widgets.
const CORE_PURE = {
  group: ['@jupyterlab/*', '@lumino/*', 'vega*', '../charts/*', '../ui/*', '../plugins/*', '../../charts/*', '../../ui/*', '../../plugins/*'],
  message: 'src/core is pure numerics: no UI, chart or JupyterLab imports.'
};

// The order of core's folders: what each may import from the rest of src/core
// (src/core/messages.ts is importable from everywhere; analysis may import
// everything). A folder not listed here is held to CORE_PURE only.
const CORE_LAYERS = {
  numeric: [],
  fit: ['numeric'],
  expr: ['fit', 'numeric'],
  physics: ['fit', 'numeric', 'units'],
  sweeps: ['fit', 'numeric', 'physics', 'units'],
  table: ['numeric', 'units'],
  units: ['numeric']
};

// One block per folder depth (src/core/<dir>/*.ts, <dir>/*/*.ts, …): at depth d
// an import leaves <dir> for the rest of core with exactly d × '../', and the
// regex rejects every name after that which is not an allowed folder or
// messages. A block's no-restricted-imports replaces the one of
// 'src/core/**', so each repeats CORE_PURE.
function coreLayerBlocks(dir, allowed) {
  const ok = [...allowed, 'messages'].join('|');
  const may = allowed.length > 0 ? `${allowed.join(', ')} and messages.ts` : 'messages.ts';
  return [1, 2, 3].map(depth => ({
    files: [`src/core/${dir}/${'*/'.repeat(depth - 1)}*.ts`],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            CORE_PURE,
            {
              regex: `^(?:\\.\\./){${depth}}(?!(?:${ok})(?:/|\\.ts$|$))[^./]`,
              message: `src/core/${dir} may import from the rest of src/core only ${may} (layers in eslint.config.mjs): move the logic down instead of importing up.`
            }
          ]
        }
      ]
    }
  }));
}

export default tseslint.config(
  {
    ignores: [
      'lib/**',
      'node_modules/**',
      'jupyterlab_psiscape/**',
      'demo/build/**',
      'demo/dist/**',
      'dist/**',
      'test-results/**',
      '.bench/**',
      '**/*.d.ts'
    ]
  },
  ...tseslint.configs.recommended,
  {
    files: ['src/**/*.ts'],
    ...jupyterRecommended[0],
    rules: {
      ...(jupyterRecommended[0].rules ?? {})
    }
  },
  {
    files: ['**/*.ts', '**/*.mts'],
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/naming-convention': [
        'error',
        { selector: 'interface', format: ['PascalCase'], custom: { regex: '^I[A-Z]', match: true } }
      ],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
      // JupyterLab's convention: a namespace named after a class holds its IOptions.
      '@typescript-eslint/no-namespace': 'off',
      curly: ['error', 'all'],
      eqeqeq: ['error', 'smart']
    }
  },
  {
    files: ['**/*.mjs', '**/*.js', '**/*.cjs'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: { '@typescript-eslint/no-require-imports': 'off' }
  },
  {
    // The core layer is pure: no DOM, no JupyterLab, no Lumino.
    files: ['src/core/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [CORE_PURE] }]
    }
  },
  ...Object.entries(CORE_LAYERS).flatMap(([dir, allowed]) => coreLayerBlocks(dir, allowed)),
  {
    // Data arrays are long: spreading one into Math.max/Math.min overflows the call stack (~150k points).
    files: ['src/**/*.ts', 'bench/**/*.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "CallExpression[callee.object.name='Math'][callee.property.name=/^(max|min)$/] > SpreadElement",
          message: 'Do not spread an array into Math.max/Math.min (a long one overflows the call stack): use a loop.'
        }
      ]
    }
  },
  {
    files: ['src/charts/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['@jupyterlab/*', '@lumino/*', '../ui/*', '../plugins/*'], message: 'src/charts builds specs only: no widgets or plugins.' }] }
      ]
    }
  },
  {
    files: ['src/ui/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['../plugins/*'], message: 'src/ui must not depend on plugin wiring.' }] }
      ]
    }
  }
);
