/** pg-boss keeps its tables in this schema of the application's database (created by migration 0009). */
export const BOSS_SCHEMA = 'pgboss';
/** The queue of background bakes: one job per proposal (data: { bakeId }). */
export const BAKE_QUEUE = 'version-bake';
/** Where pg-boss moves a bake job that failed its last retry (also after a worker was killed): marks the bake failed. */
export const BAKE_DEAD_QUEUE = 'version-bake-failed';
