/** The migrated template database that scripts/test-run.ts prepares and each test file clones. */
export const TEMPLATE_DB = 'tangentry_template';
