/**
 * The demo scenario of the brief (invented): the studio "Corvid Lantern Games"
 * making "Tidewright", with the teams "UI Motion" and "Gameplay Feel". Seeded
 * into an empty database only; later features add their own demo rows here.
 */
import type { AppContext } from '../context';
import { Studio, Team } from '../models';

export const DEMO_STUDIO = { name: 'Corvid Lantern Games', slug: 'corvid-lantern' };
export const DEMO_TEAMS = [
  { name: 'UI Motion', slug: 'ui-motion' },
  { name: 'Gameplay Feel', slug: 'gameplay-feel' },
];

/** Returns true when it seeded, false when the database already had a studio. */
export async function seedDemoIfEmpty(ctx: AppContext): Promise<boolean> {
  return ctx.sequelize.transaction(async (transaction) => {
    if ((await Studio.count({ transaction })) > 0) return false;
    const studio = await Studio.create(DEMO_STUDIO, { transaction });
    for (const team of DEMO_TEAMS) await Team.create({ ...team, studioId: studio.id }, { transaction });
    return true;
  });
}
