/**
 * The build-server API's reads, built on the packs, versions, channels and profiles modules:
 * who is asking, the team's packs with their latest version and channels, a version's manifest,
 * a channel's manifest, and the stored object behind a download URL. The hot reads (manifests, channel
 * reads, downloads) are the joined queries of ./api-v1.reads.ts, not the versions/channels services.
 */
import { tokenAllowsPack, type Principal } from '../auth/principal';
import { notFound } from '../http/errors';
import { getPack, listPacks } from '../packs/packs.service';
import type { Storage } from '../versions/versions.service';
import { listProfiles } from '../profiles/profiles.repository';
import { findTeam, teamsOfUser } from '../teams/teams.repository';
import { readContentAddressed } from '../storage/content-store';
import { fileStem } from '../versions/build-artifacts';
import type { ManifestDto, ManifestTargetDto, PackSummaryV1, WhoamiDto } from '../../shared/schemas/api-v1';
import { channelPointers, latestVersionNumbers } from './api-v1.repository';
import { versionByNumber, versionOfChannel, type ArtifactRow, type ImmutableVersion, type ImmutableVersions, type VersionRead } from './api-v1.reads';

export async function whoami(p: Principal): Promise<WhoamiDto> {
  if (p.kind === 'token') {
    const team = await findTeam(p.token.teamId);
    return { principal: { kind: 'token', name: p.token.name }, teams: team ? [{ id: team.id, slug: team.slug, name: team.name }] : [] };
  }
  if (p.kind !== 'user') throw new Error('whoami needs a token or a person');
  const teams = await teamsOfUser(p.user.id);
  return { principal: { kind: 'user', name: p.user.name }, teams: teams.map((t) => ({ id: t.id, slug: t.slug, name: t.name })) };
}

export async function packSummaries(p: Principal, teamId: string): Promise<PackSummaryV1[]> {
  const packs = await listPacks(p, teamId);
  const ids = packs.map((x) => x.id);
  const [latest, channels] = await Promise.all([latestVersionNumbers(ids), channelPointers(ids)]);
  return packs.map((x) => ({
    slug: x.slug, name: x.name, description: x.description, frameRate: x.frameRate, tags: x.tags, archived: x.archived,
    latestVersion: latest.get(x.id) ?? null, channels: channels.get(x.id) ?? [],
  }));
}

/** Curve names of a stored source, by its content key: immutable, so kept once read (bounded). */
const curveNamesByKey = new Map<string, string[]>();
const MAX_CACHED_SOURCES = 500;

async function curveNames(storage: Storage, key: string): Promise<string[]> {
  const hit = curveNamesByKey.get(key);
  if (hit) return hit;
  const bytes = await readContentAddressed(storage.s3, storage.bucket, key);
  const names = (JSON.parse(new TextDecoder().decode(bytes)) as { curves: { name: string }[] }).curves.map((c) => c.name);
  if (curveNamesByKey.size >= MAX_CACHED_SOURCES) curveNamesByKey.delete(curveNamesByKey.keys().next().value!);
  curveNamesByKey.set(key, names);
  return names;
}

export const versionPath = (teamId: string, slug: string, number: number) => `/api/v1/teams/${teamId}/packs/${slug}/versions/${number}`;

/** A token limited to other packs, or no such pack: the packs service's 404 (no query for the former). */
async function refusePack(p: Principal, teamId: string, slug: string): Promise<void> {
  await getPack(p, teamId, slug);
}

/**
 * A version's manifest. Targets are in the order they were baked. Kernel, layout, encoding and tolerance
 * are those of the profile snapshot the version was baked with (its bake row, version_bakes.profiles), so
 * editing or deleting a profile later does not change what an old manifest says. Versions made before
 * background bakes have no snapshot: for them the team's profile of that name as defined now is shown
 * (null when it was deleted).
 */
export async function manifestOf(storage: Storage, teamId: string, slug: string, v: VersionRead): Promise<ManifestDto> {
  const [names, profiles] = await Promise.all([
    curveNames(storage, v.source.key),
    v.bakedProfiles ?? listProfiles(teamId).then((list) => list.map((s) => s.profile)),
  ]);
  const byName = new Map(profiles.map((profile) => [profile.name, profile]));
  const base = versionPath(teamId, slug, v.number);
  const targets = new Map<string, ManifestTargetDto>();
  for (const a of v.artifacts) {
    if (a.profileName === null) continue;
    let t = targets.get(a.profileName);
    if (!t) {
      const profile = byName.get(a.profileName);
      t = {
        name: a.profileName, target: fileStem(a.profileName),
        kernel: profile?.kernel ?? null, layout: profile?.layout ?? null, encoding: profile?.encoding ?? null,
        tolerance: profile ? { mode: profile.tolerance.mode, value: profile.tolerance.value } : null,
        failures: v.bakeSummary.find((s) => s.profile === a.profileName)?.failures ?? [],
        artifacts: [],
      };
      targets.set(a.profileName, t);
    }
    t.artifacts.push({ format: a.format, fileName: a.fileName, mediaType: a.mediaType, size: a.size, sha256: a.sha256, url: `${base}/artifacts/${t.target}/${a.format}` });
  }
  return {
    pack: slug, version: v.number, state: v.state, changelog: v.changelog, createdAt: v.createdAt,
    source: { sha256: v.source.sha256, size: v.source.size, url: `${base}/source` },
    curves: names, targets: [...targets.values()],
  };
}

/** One joined query (./api-v1.reads.ts); the immutable part is remembered for downloads. */
export async function versionManifest(storage: Storage, versions: ImmutableVersions, p: Principal, teamId: string, slug: string, number: number): Promise<ManifestDto> {
  if (!tokenAllowsPack(p, slug)) await refusePack(p, teamId, slug);
  const v = await versionByNumber(teamId, slug, number);
  if (!v) {
    await refusePack(p, teamId, slug);
    throw notFound(`Pack "${slug}" has no version v${number}.`);
  }
  versions.remember(teamId, slug, v);
  return manifestOf(storage, teamId, slug, v);
}

/** The channel pointer is read from the database every time, joined to its version in the same query. */
export async function channelManifest(storage: Storage, versions: ImmutableVersions, p: Principal, teamId: string, slug: string, channel: string): Promise<{ pack: string; channel: string; version: number; manifest: ManifestDto }> {
  if (!tokenAllowsPack(p, slug)) await refusePack(p, teamId, slug);
  const v = await versionOfChannel(teamId, slug, channel);
  if (!v) {
    await refusePack(p, teamId, slug);
    throw notFound(`Pack "${slug}" has no channel "${channel}".`);
  }
  versions.remember(teamId, slug, v);
  return { pack: slug, channel, version: v.number, manifest: await manifestOf(storage, teamId, slug, v) };
}

export interface Download {
  sha256: string;
  size: number;
  mediaType: string;
  key: string;
  downloadName: string;
}

const asDownload = (slug: string, number: number, a: Pick<ArtifactRow, 'sha256' | 'size' | 'mediaType' | 'key' | 'fileName'>): Download => ({
  sha256: a.sha256, size: a.size, mediaType: a.mediaType, key: a.key, downloadName: `${slug}-v${number}-${a.fileName}`,
});

/** The immutable part of a version the caller may read (memory, else one query), or the 404 it gets. */
async function immutableVersion(versions: ImmutableVersions, p: Principal, teamId: string, slug: string, number: number): Promise<ImmutableVersion> {
  if (!tokenAllowsPack(p, slug)) await refusePack(p, teamId, slug);
  const v = await versions.get(teamId, slug, number);
  if (v) return v;
  await refusePack(p, teamId, slug);
  throw notFound(`Pack "${slug}" has no version v${number}.`);
}

/** The stored artifact of version `number` for a target (by file stem) and format. */
export async function findDownload(versions: ImmutableVersions, p: Principal, teamId: string, slug: string, number: number, target: string, format: string): Promise<Download> {
  const v = await immutableVersion(versions, p, teamId, slug, number);
  const ofTarget = v.artifacts.filter((a) => a.profileName !== null && fileStem(a.profileName) === target);
  if (ofTarget.length === 0) {
    const known = [...new Set(v.artifacts.filter((a) => a.profileName !== null).map((a) => fileStem(a.profileName!)))];
    throw notFound(`v${number} of "${slug}" has no target "${target}"${known.length ? `; it has ${known.join(', ')}` : ''}.`);
  }
  const a = ofTarget.find((x) => x.format === format);
  if (!a) throw notFound(`Target "${target}" of v${number} of "${slug}" has no ${format} artifact; it has ${ofTarget.map((x) => x.format).join(', ')}.`);
  return asDownload(slug, number, a);
}

export async function findSource(versions: ImmutableVersions, p: Principal, teamId: string, slug: string, number: number): Promise<Download> {
  const v = await immutableVersion(versions, p, teamId, slug, number);
  const a = v.artifacts.find((x) => x.profileName === null && x.format === 'source');
  return asDownload(slug, number, a ?? { ...v.source, mediaType: 'application/json', fileName: 'source.json' });
}
