/**
 * The build-server API's hot reads, each one joined SQL query (docs/benchmarks.md "API" has the counts):
 *   - versionByNumber: (team, pack slug, version number) → the version row, its artifact rows in order and
 *     the target profiles its bake used (version_bakes.profiles, migration 0009), in one round trip;
 *   - versionOfChannel: (team, pack slug, channel name) → the same for the version the channel points at
 *     now; the channel pointer is read from the database on every call (never cached), so several app
 *     instances never disagree about where a channel points.
 * Reviews, proposer names and channel history are not read: the v1 answers do not show them.
 *
 * ImmutableVersions keeps the parts of a version that never change once it is visible (its artifact rows,
 * source, bake summary, baked profiles; versions are inserted with all their artifacts in one transaction
 * and neither packs, their slugs nor versions can be deleted or renamed), so a download or a 304 of an
 * immutable artifact needs no query beyond authentication. The review state is mutable and is not kept.
 */
import { QueryTypes } from 'sequelize';
import { PackVersion } from '../models';
import type { Profile } from '../../shared/bake';
import type { ArtifactDto, BakeSummary } from '../../shared/schemas/versions';

export type ArtifactRow = Omit<ArtifactDto, 'id'>;

/** What never changes once a version is visible. */
export interface ImmutableVersion {
  id: string;
  number: number;
  changelog: string;
  createdAt: string;
  source: { key: string; sha256: string; size: number };
  bakeSummary: BakeSummary[];
  artifacts: ArtifactRow[];
  /** The profiles the version was baked with; null for versions made before background bakes (no bake row). */
  bakedProfiles: Profile[] | null;
}

export interface VersionRead extends ImmutableVersion {
  /** The review state (mutable). */
  state: string;
}

interface Row {
  id: string;
  number: number;
  state: string;
  changelog: string;
  createdAt: Date | string;
  sourceKey: string;
  sourceSha256: string;
  sourceSize: number;
  bakeSummary: BakeSummary[];
  artifacts: ArtifactRow[];
  bakedProfiles: Profile[] | null;
}

// json_agg keeps the artifacts in their baked order; a bake row is linked to at most one version, the
// latest finished one is taken should a retry ever have linked two.
const VERSION_COLUMNS = `
  v.id, v.number, v.state, v.changelog, v.created_at AS "createdAt",
  v.source_key AS "sourceKey", v.source_sha256 AS "sourceSha256", v.source_size AS "sourceSize", v.bake_summary AS "bakeSummary",
  COALESCE((SELECT json_agg(json_build_object(
      'profileName', a.profile_name, 'format', a.format, 'fileName', a.file_name, 'mediaType', a.media_type,
      'key', a.key, 'sha256', a.sha256, 'size', a.size) ORDER BY a.position)
    FROM version_artifacts a WHERE a.version_id = v.id), '[]'::json) AS artifacts,
  (SELECT b.profiles FROM version_bakes b WHERE b.version_id = v.id ORDER BY b.finished_at DESC NULLS LAST LIMIT 1) AS "bakedProfiles"`;

const toRead = (r: Row): VersionRead => ({
  id: r.id, number: r.number, state: r.state, changelog: r.changelog,
  createdAt: (r.createdAt instanceof Date ? r.createdAt : new Date(r.createdAt)).toISOString(),
  source: { key: r.sourceKey, sha256: r.sourceSha256, size: Number(r.sourceSize) },
  bakeSummary: r.bakeSummary, artifacts: r.artifacts.map((a) => ({ ...a, size: Number(a.size) })), bakedProfiles: r.bakedProfiles,
});

async function one(sql: string, replacements: Record<string, unknown>): Promise<Row | null> {
  const rows = await PackVersion.sequelize!.query<Row>(sql, { replacements, type: QueryTypes.SELECT });
  return rows[0] ?? null;
}

export async function versionByNumber(teamId: string, slug: string, number: number): Promise<VersionRead | null> {
  if (!Number.isSafeInteger(number) || number <= 0) return null;
  const r = await one(
    `SELECT ${VERSION_COLUMNS} FROM packs p JOIN pack_versions v ON v.pack_id = p.id
     WHERE p.team_id = :teamId AND p.slug = :slug AND v.number = :number`,
    { teamId, slug, number },
  );
  return r ? toRead(r) : null;
}

export async function versionOfChannel(teamId: string, slug: string, channel: string): Promise<VersionRead | null> {
  const r = await one(
    `SELECT ${VERSION_COLUMNS} FROM packs p JOIN channels c ON c.pack_id = p.id AND c.name = :channel
       JOIN pack_versions v ON v.id = c.version_id
     WHERE p.team_id = :teamId AND p.slug = :slug`,
    { teamId, slug, channel },
  );
  return r ? toRead(r) : null;
}

/** A bounded in-memory map (oldest entry dropped first) of the immutable part of versions, per app. */
export class ImmutableVersions {
  private readonly entries = new Map<string, ImmutableVersion>();
  constructor(private readonly max = 1000) {}

  private static key(teamId: string, slug: string, number: number): string {
    return `${teamId}\u0000${slug}\u0000${number}`;
  }

  remember(teamId: string, slug: string, v: VersionRead): void {
    const { state: _mutable, ...immutable } = v;
    const key = ImmutableVersions.key(teamId, slug, v.number);
    if (this.entries.has(key)) return;
    if (this.entries.size >= this.max) this.entries.delete(this.entries.keys().next().value!);
    this.entries.set(key, immutable);
  }

  /** The immutable part of version `number`, from memory or one query (then kept); null when there is none. */
  async get(teamId: string, slug: string, number: number): Promise<ImmutableVersion | null> {
    const hit = this.entries.get(ImmutableVersions.key(teamId, slug, number));
    if (hit) return hit;
    const v = await versionByNumber(teamId, slug, number);
    if (v) this.remember(teamId, slug, v);
    return v;
  }
}
