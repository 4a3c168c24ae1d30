/**
 * Turns team events into in-app notices:
 *   version approved / changes requested / commented on → its proposer (not for their own action);
 *   version's background bake failed                    → its proposer;
 *   version proposed                                    → the team's reviewers (versions.review), not the proposer.
 * The review e-mail (server/versions/review-mail.ts) is sent by the review route as before.
 */
import type { AppContext } from '../context';
import type { TeamEvent } from '../events/team-events';
import { PERMISSIONS } from '../../shared/schemas/roles';
import { insertNotices, membersWithRoles, nameOf, proposerOf, type NewNotice } from './notifications.repository';

const TO_PROPOSER = new Set(['version.approved', 'version.changes-requested', 'version.commented', 'version.bake-failed']);

function versionNumber(e: TeamEvent): number | null {
  const n = e.data.version;
  if (typeof n === 'number') return n;
  const m = /^v(\d+)$/.exec(e.subject.label);
  return m ? Number(m[1]) : null;
}

function sentence(e: TeamEvent, actor: string, what: string): string {
  const d = e.data;
  const str = (v: unknown) => (typeof v === 'string' && v ? v : null);
  switch (e.type) {
    case 'version.approved': return `${actor} approved ${what}`;
    case 'version.changes-requested': return `${actor} asked for changes to ${what}${str(d.comment) ? `: “${str(d.comment)}”` : ''}`;
    case 'version.commented': {
      const where = str(d.curve) ? ` at ${str(d.curve)}${typeof d.time === 'number' ? `, t = ${d.time} s` : ''}` : '';
      return `${actor} commented on ${what}${where}${str(d.excerpt) ? `: “${str(d.excerpt)}”` : ''}`;
    }
    case 'version.bake-failed': return `The bake of ${what} failed${str(d.target) ? ` for ${str(d.target)}` : ''}${str(d.curve) ? ` at the curve ${str(d.curve)}` : ''}${str(d.reason) ? `: ${str(d.reason)}` : ''}`;
    case 'version.proposed': return `${actor} proposed ${what} for review`;
    default: return `${actor}: ${e.type} ${what}`;
  }
}

export async function noticesFor(e: TeamEvent): Promise<NewNotice[]> {
  if (e.subject.kind !== 'version' || !e.pack) return [];
  let recipients: string[];
  if (TO_PROPOSER.has(e.type)) {
    const proposer = typeof e.data.proposedBy === 'string' ? e.data.proposedBy : e.subject.id ? await proposerOf(e.subject.id) : null;
    recipients = proposer && proposer !== e.actorId ? [proposer] : [];
  } else if (e.type === 'version.proposed') {
    recipients = (await membersWithRoles(e.teamId, PERMISSIONS['versions.review'])).filter((u) => u !== e.actorId);
  } else {
    return [];
  }
  if (!recipients.length) return [];
  const n = versionNumber(e);
  const what = n === null ? `your proposal of ${e.pack.slug}${typeof e.data.changelog === 'string' ? ` (“${e.data.changelog.slice(0, 80)}”)` : ''}` : `v${n} of ${e.pack.slug}`;
  const actor = (await nameOf(e.actorId)) ?? 'Tangentry';
  const link = `/packs/${encodeURIComponent(e.pack.slug)}${n === null ? '' : `/versions/${n}`}${e.type === 'version.commented' ? '#comments' : ''}`;
  const text = sentence(e, actor, what).slice(0, 400);
  // a failed bake's subject is the proposal (a bake row), not a version: only a numbered version is linked by id
  const versionId = n !== null && e.subject.id ? e.subject.id : null;
  return recipients.map((userId) => ({ userId, type: e.type, teamId: e.teamId, packId: e.pack!.id, versionId, text, link }));
}

export function registerNotificationSubscriber(ctx: AppContext): void {
  ctx.events.subscribe('notifications', async (e) => insertNotices(await noticesFor(e)));
}
