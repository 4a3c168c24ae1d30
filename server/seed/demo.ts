/**
 * The demo scenario of the brief (invented): the studio "Corvid Lantern Games"
 * making "Tidewright", with the teams "UI Motion" and "Gameplay Feel". Seeded
 * into an empty database only; later features add their own demo rows here.
 */
import type { AppContext } from '../context';
import { Curve, Membership, Pack, Studio, TargetProfile, Team, User } from '../models';
import { hashPassword } from '../auth/password';
import { newUserId } from '../auth/auth.service';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';
import { DEMO_PROFILES } from '../../shared/bake/profile';
import { DEMO_PACKS } from './demo-packs';

export const DEMO_STUDIO = { name: 'Corvid Lantern Games', slug: 'corvid-lantern' };
export const DEMO_TEAMS = [
  { name: 'UI Motion', slug: 'ui-motion' },
  { name: 'Gameplay Feel', slug: 'gameplay-feel' },
];

/** Returns true when it seeded, false when the database already had a studio. */
export async function seedDemoIfEmpty(ctx: AppContext): Promise<boolean> {
  // demo accounts (embedded default only, config.demoAccounts): hashed before the transaction opens
  const accountHashes = ctx.config.demoAccounts ? await Promise.all(DEMO_ACCOUNTS.map(() => hashPassword(DEMO_PASSWORD))) : [];
  return ctx.sequelize.transaction(async (transaction) => {
    if ((await Studio.count({ transaction })) > 0) return false;
    const studio = await Studio.create(DEMO_STUDIO, { transaction });
    const teamIds = new Map<string, string>();
    for (const team of DEMO_TEAMS) teamIds.set(team.slug, (await Team.create({ ...team, studioId: studio.id }, { transaction })).id);
    // the brief's four targets (Console, Handheld, Mobile, Web) in every team
    for (const teamId of teamIds.values()) {
      for (const [position, spec] of DEMO_PROFILES.entries()) await TargetProfile.create({ teamId, name: spec.name, spec, position }, { transaction });
    }
    // the brief's five packs with their curves (issue 7)
    for (const { team, curves, ...pack } of DEMO_PACKS) {
      const row = await Pack.create({ ...pack, teamId: teamIds.get(team)! }, { transaction });
      for (const [position, document] of curves.entries()) await Curve.create({ packId: row.id, name: document.name, document, position }, { transaction });
    }
    for (const [i, account] of accountHashes.length ? DEMO_ACCOUNTS.entries() : []) {
      const user = await User.create({ id: newUserId(), email: account.email, name: account.name, passwordHash: accountHashes[i]!, studioId: studio.id }, { transaction });
      for (const [slug, role] of Object.entries(account.teams)) await Membership.create({ teamId: teamIds.get(slug)!, userId: user.id, role }, { transaction });
    }
    return true;
  });
}
