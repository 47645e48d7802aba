// Three test projects: unit (beside the code, no services), api (supertest against real
// PostgreSQL; needs scripts/test.sh to have started it), e2e (Chromium against a served build).
import { defineConfig } from 'vitest/config';
import path from 'node:path';

const root = path.dirname(new URL(import.meta.url).pathname);
const alias = { '@': root };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['optimizer/**/*.test.ts', 'shared/**/*.test.ts', 'server/**/*.test.ts', 'scripts/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
        },
      },
      {
        resolve: {
          alias: { ...alias, 'react-native': 'react-native-web' },
          extensions: ['.web.tsx', '.web.ts', '.web.js', '.tsx', '.ts', '.js', '.mjs', '.json'],
          mainFields: ['module', 'browser', 'main'],
        },
        test: {
          name: 'components',
          include: ['components/**/*.test.tsx', 'components/**/*.test.ts'],
          environment: 'happy-dom',
          server: { deps: { inline: ['react-native-svg', 'react-native-web'] } },
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/integration/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          testTimeout: 180_000,
          hookTimeout: 240_000,
        },
      },
    ],
  },
});
