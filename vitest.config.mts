import { defineConfig } from 'vitest/config';

/**
 * Two projects: `node` for the pure numerics and chart builders, `jsdom` for
 * widgets and plugins exercised through real Lumino / JupyterLab objects.
 */
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'node',
          environment: 'node',
          include: ['test/core/**/*.test.ts', 'test/charts/**/*.test.ts', 'test/package/**/*.test.ts'],
          testTimeout: 120000
        }
      },
      {
        test: {
          name: 'jsdom',
          environment: 'jsdom',
          include: ['test/ui/**/*.test.ts', 'test/plugins/**/*.test.ts'],
          setupFiles: ['test/setup-dom.ts'],
          testTimeout: 60000,
          server: {
            deps: {
              inline: [/@jupyter\/web-components/, /@jupyter\/react-components/, /@microsoft\/fast-/]
            }
          }
        }
      }
    ]
  }
});
