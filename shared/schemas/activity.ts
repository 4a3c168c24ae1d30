/**
 * The team activity table: the query the API accepts (`GET /api/teams/:teamId/activity`), the rows it
 * answers, and the words a row is read in ("moved shipping from v2 to v3"). Pure: the server and the
 * client share `describeActivity`, so the table and the API tests read the same sentence.
 */
import { z } from 'zod';
import { PACK_SLUG } from './packs';

/** Every team event type (server/events/team-events.ts TeamEventType; the server checks the two agree). */
export const ACTIVITY_TYPES = [
  'pack.created', 'pack.updated', 'pack.archived', 'pack.restored',
  'curve.created', 'curve.saved', 'curve.deleted', 'curve.moved', 'curve.copied', 'curves.reordered', 'curves.uploaded',
  'profile.created', 'profile.updated', 'profile.deleted',
  'version.proposed', 'version.bake-failed', 'version.approved', 'version.changes-requested', 'version.commented',
  'channel.moved',
] as const;
export type ActivityType = (typeof ACTIVITY_TYPES)[number];

export const SUBJECT_KINDS = ['pack', 'curve', 'version', 'profile', 'channel'] as const;
export type SubjectKind = (typeof SUBJECT_KINDS)[number];

/** Short labels for the type filter. */
export const ACTIVITY_TYPE_LABEL: Record<ActivityType, string> = {
  'pack.created': 'pack created', 'pack.updated': 'pack changed', 'pack.archived': 'pack archived', 'pack.restored': 'pack restored',
  'curve.created': 'curve added', 'curve.saved': 'curve saved', 'curve.deleted': 'curve deleted', 'curve.moved': 'curve moved',
  'curve.copied': 'curve copied', 'curves.reordered': 'curves reordered', 'curves.uploaded': 'curves uploaded',
  'profile.created': 'target profile added', 'profile.updated': 'target profile changed', 'profile.deleted': 'target profile deleted',
  'version.proposed': 'version proposed', 'version.bake-failed': 'bake failed', 'version.approved': 'version approved',
  'version.changes-requested': 'changes requested', 'version.commented': 'comment', 'channel.moved': 'channel moved',
};

export const ACTIVITY_PAGE_DEFAULT = 25;
export const ACTIVITY_PAGE_MAX = 100;

/** Opaque page cursors: base64url of "<ISO time>|<row id>" (the keyset (at, id), newest first). */
const CURSOR = /^[A-Za-z0-9_-]{8,200}$/;
const cursor = (field: 'before' | 'after') =>
  z.string().regex(CURSOR, { error: `${field}: not a page cursor from this API` }).optional();

export const activityQuerySchema = z
  .object({
    type: z.enum(ACTIVITY_TYPES, { error: `type: must be one of ${ACTIVITY_TYPES.join(', ')}` }).optional(),
    pack: z.string().max(60, { error: 'pack: at most 60 characters' }).regex(PACK_SLUG, { error: 'pack: a pack slug, like jump-arcs' }).optional(),
    actor: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, { error: 'actor: a person id' }).optional(),
    subject: z.enum(SUBJECT_KINDS, { error: `subject: must be one of ${SUBJECT_KINDS.join(', ')}` }).optional(),
    before: cursor('before'),
    after: cursor('after'),
    limit: z.coerce
      .number({ error: 'limit: must be a number' })
      .int({ error: 'limit: must be a whole number' })
      .min(1, { error: 'limit: must be at least 1' })
      .max(ACTIVITY_PAGE_MAX, { error: `limit: at most ${ACTIVITY_PAGE_MAX}` })
      .default(ACTIVITY_PAGE_DEFAULT),
    count: z.enum(['true', 'false'], { error: 'count: true or false' }).optional().transform((v) => v === 'true'),
  })
  .superRefine((q, ctx) => {
    if (q.before && q.after) ctx.addIssue({ code: 'custom', path: ['after'], message: 'after: use before or after, not both' });
  });
export type ActivityQuery = z.output<typeof activityQuerySchema>;

export interface ActivityItem {
  id: string;
  type: ActivityType;
  at: string;
  /** null for the system (a background bake) or a removed account. */
  actor: { id: string; name: string } | null;
  pack: { id: string | null; slug: string; name: string } | null;
  subject: { kind: SubjectKind; id: string | null; label: string };
  data: Record<string, unknown>;
  /** What happened, in words, without the actor: "moved shipping from v2 to v3". */
  words: string;
  /** Client paths of what the row names (pack, version, curve), where they exist. */
  links: { pack?: string; version?: string; curve?: string; profiles?: string };
}

export interface ActivityPage {
  items: ActivityItem[];
  /** Cursor for the next older page, null when this page holds the oldest row. */
  older: string | null;
  /** Cursor for the next newer page, null when this page holds the newest row. */
  newer: string | null;
  /** Rows matching the filters, when asked with count=true. */
  total?: number;
}

const str = (v: unknown): string | null => (typeof v === 'string' && v ? v : null);
const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const ver = (v: unknown): string | null => (num(v) === null ? null : `v${num(v)}`);

/** The sentence for one row, without the actor ("Ana " + words in the table). */
export function describeActivity(a: Pick<ActivityItem, 'type' | 'pack' | 'subject' | 'data'>): string {
  const label = a.subject.label;
  const pack = a.pack?.slug ?? 'a pack';
  const d = a.data;
  switch (a.type) {
    case 'pack.created': return `created the pack ${pack}`;
    case 'pack.updated': {
      const renamed = str(d.renamedFrom);
      return renamed && a.pack && renamed !== a.pack.name ? `renamed the pack ${pack} from “${renamed}” to “${a.pack.name}”` : `changed the details of ${pack}`;
    }
    case 'pack.archived': return `archived the pack ${pack}`;
    case 'pack.restored': return `restored the pack ${pack}`;
    case 'curve.created': return `added the curve ${label} to ${pack}`;
    case 'curve.saved': return num(d.revision) === null ? `saved ${label} in ${pack}` : `saved ${label} in ${pack} (revision ${num(d.revision)})`;
    case 'curve.deleted': return `deleted the curve ${label} from ${pack}`;
    case 'curve.moved': return `moved the curve ${label} from ${pack} to ${str(d.toPack) ?? 'another pack'}`;
    case 'curve.copied': {
      const as = str(d.name);
      return `copied the curve ${str(d.from) ?? label} from ${pack} to ${str(d.toPack) ?? 'another pack'}${as && as !== (str(d.from) ?? label) ? ` as ${as}` : ''}`;
    }
    case 'curves.reordered': return `reordered the curves of ${pack}`;
    case 'curves.uploaded': {
      // server/uploads publishes { files, stored, failed, curves }
      const n = num(d.curves);
      const files = num(d.files);
      return n === null ? `uploaded curves to ${pack}` : `uploaded ${n} curve${n === 1 ? '' : 's'} to ${pack}${files === null ? '' : ` from ${files} file${files === 1 ? '' : 's'}`}`;
    }
    case 'profile.created': return `added the target profile ${label}`;
    case 'profile.updated': return `changed the target profile ${label}`;
    case 'profile.deleted': return `deleted the target profile ${label}`;
    case 'version.proposed': return `proposed ${label} of ${pack}`;
    case 'version.bake-failed': return `could not bake ${ver(d.version) ?? 'a proposal'} of ${pack}${str(d.target) ? ` for ${str(d.target)}` : ''}${str(d.curve) ? ` (curve ${str(d.curve)})` : ''}${str(d.reason) ? `: ${str(d.reason)}` : ''}`;
    case 'version.approved': return `approved ${label} of ${pack}`;
    case 'version.changes-requested': return `asked for changes to ${label} of ${pack}`;
    case 'version.commented': {
      const curve = str(d.curve);
      const time = num(d.time);
      const where = curve ? ` at ${curve}${time === null ? '' : `, t = ${time} s`}` : '';
      return `commented on ${label} of ${pack}${where}`;
    }
    case 'channel.moved': {
      const from = ver(d.from);
      const to = ver(d.to) ?? 'a version';
      const channel = str(d.channel) ?? label;
      return from ? `moved ${channel} of ${pack} from ${from} to ${to}` : `pointed ${channel} of ${pack} at ${to}`;
    }
  }
}

/** Client paths of what a row names. */
export function activityLinks(a: Pick<ActivityItem, 'type' | 'pack' | 'subject' | 'data'>): ActivityItem['links'] {
  const links: ActivityItem['links'] = {};
  if (!a.pack) return a.subject.kind === 'profile' ? { profiles: '/team/profiles' } : links;
  const p = `/packs/${encodeURIComponent(a.pack.slug)}`;
  links.pack = p;
  const n = num(a.data.version) ?? (a.type === 'channel.moved' ? num(a.data.to) : null);
  if (n !== null) links.version = `${p}/versions/${n}`;
  if (a.subject.kind === 'curve' && a.subject.id && a.type !== 'curve.deleted' && a.type !== 'curve.moved' && a.type !== 'curve.copied') links.curve = `${p}/curves/${encodeURIComponent(a.subject.id)}`;
  if ((a.type === 'curve.moved' || a.type === 'curve.copied') && a.subject.id && str(a.data.toPack)) links.curve = `/packs/${encodeURIComponent(str(a.data.toPack)!)}/curves/${encodeURIComponent(a.subject.id)}`;
  return links;
}
