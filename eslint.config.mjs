// Lint configuration: typescript-eslint on strict TypeScript plus the Jupyter
// extension rules (plugin descriptions, command ids, translation hygiene).
import tseslint from 'typescript-eslint';
import jupyter from '@jupyter/eslint-plugin';
import globals from 'globals';

const jupyterRecommended = Array.isArray(jupyter.configs.recommended)
  ? jupyter.configs.recommended
  : [jupyter.configs.recommended];

export default tseslint.config(
  {
    ignores: [
      'lib/**',
      'node_modules/**',
      'jupyterlab_psiscape/**',
      'demo/build/**',
      'demo/dist/**',
      'demo/server/build/**',
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
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['@jupyterlab/*', '@lumino/*', 'vega*', '../charts/*', '../ui/*', '../plugins/*', '../../charts/*', '../../ui/*', '../../plugins/*'], message: 'src/core is pure numerics: no UI, chart or JupyterLab imports.' }
          ]
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
