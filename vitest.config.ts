import { defineConfig, mergeConfig } from 'vitest/config';
import viteConfig from './vite.config.ts';

// Four projects: the pure engine, the API on a real private MariaDB,
// React components in jsdom, and the built app in headless chromium.
export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      projects: [
        {
          extends: true,
          test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'] },
        },
        {
          extends: true,
          test: {
            name: 'server',
            environment: 'node',
            include: ['tests/server/**/*.test.ts'],
            globalSetup: ['tests/support/mariadb-global.ts'],
            testTimeout: 30_000,
            hookTimeout: 60_000,
          },
        },
        {
          extends: true,
          test: {
            name: 'client',
            environment: 'jsdom',
            include: ['tests/client/**/*.test.tsx'],
            setupFiles: ['tests/support/client-setup.ts'],
          },
        },
        {
          extends: true,
          test: {
            name: 'browser',
            environment: 'node',
            include: ['tests/browser/**/*.test.ts'],
            globalSetup: ['tests/support/browser-global.ts'],
            testTimeout: 60_000,
            hookTimeout: 180_000,
            fileParallelism: false,
          },
        },
      ],
    },
  }),
);
