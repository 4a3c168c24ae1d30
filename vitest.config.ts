import { defineConfig } from 'vitest/config';

// Unit, integration and API tests. Integration/API tests read the service
// addresses that scripts/test-run.ts puts in the environment (DATABASE_URL,
// S3_ENDPOINT, SMTP_URL); component tests opt into jsdom per file with
// `// @vitest-environment jsdom`.
export default defineConfig({
  test: {
    include: ['tests/**/*.test.{ts,tsx}'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
