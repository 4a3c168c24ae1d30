/**
 * Row counts of every table in the app's database, for "nothing stored" checks: snapshot before a
 * run of bad requests, snapshot after, compare. Sessions, rate-limit and log-like tables are left out
 * (signing in creates sessions; a log may record a refused request). Everything else counts.
 */
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';

const IGNORED = /session|rate_limit|_log$|^log|SequelizeMeta|umzug|migrations/i;

export async function tableCounts(sequelize: Sequelize): Promise<Record<string, number>> {
  const tables = await sequelize.query<{ name: string }>(
    "SELECT table_name::text AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY table_name",
    { type: QueryTypes.SELECT },
  );
  const out: Record<string, number> = {};
  for (const { name } of tables) {
    if (IGNORED.test(name)) continue;
    const [row] = await sequelize.query<{ n: string }>(`SELECT count(*)::text AS n FROM "${name.replace(/"/g, '')}"`, { type: QueryTypes.SELECT });
    out[name] = Number(row!.n);
  }
  return out;
}
