/**
 * One attempt at a background bake (called by the pg-boss job in server/jobs/bake-worker.ts, or directly
 * by proposeVersion): read the proposal's source from the bucket (checked against its SHA-256), bake every
 * target profile of the snapshot with ./build-artifacts.ts, store each object content-addressed (HeadObject
 * first, so a retry after a crash re-uploads nothing already there), report progress per target, and only
 * then insert the version and its artifact rows in one transaction (bakes.repository completeBake, under
 * the bake row's lock, so a bake never makes two versions).
 *
 * A curve that does not fit a target is a normal result (named in the bake summary). A failure is an
 * exception: storage down, a corrupt source, the baker throwing — the attempt records the target, the
 * curve (when one was being baked) and the reason, and the caller decides whether pg-boss retries.
 */
import type { Storage } from './versions.service';
import { putContentAddressed, readContentAddressed } from '../storage/content-store';
import type { ArtifactDto, BakeDto, VersionDto } from '../../shared/schemas/versions';
import { buildTarget, CurveBakeError, readSource } from './build-artifacts';
import * as bakes from './bakes.repository';

export interface BakeRunDeps {
  storage: Storage;
  /** Test-only pause after each target (TANGENTRY_BAKE_DELAY_MS), so a worker can be killed mid-bake. */
  delayMs?: number;
}

export type BakeOutcome =
  | { kind: 'done'; created: boolean; version: VersionDto; bakeId: string; proposedBy: string | null }
  | { kind: 'failed'; failure: NonNullable<BakeDto['failure']>; bake: BakeDto | null }
  | { kind: 'gone' };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
/** Let the event loop breathe between targets (an inline worker shares the API process). */
const breathe = () => new Promise((r) => setImmediate(r));

export async function runBake(d: BakeRunDeps, bakeId: string, opts: { final: boolean }): Promise<BakeOutcome> {
  const row = await bakes.bakeRow(bakeId);
  if (!row) return { kind: 'gone' };
  if (row.versionId) {
    const done = await bakes.completeBake(bakeId, null);
    return { kind: 'done', created: false, version: done.version, bakeId, proposedBy: row.proposedBy };
  }
  const attempt = await bakes.startAttempt(bakeId);
  if (!attempt) return runBake(d, bakeId, opts); // finished by another worker meanwhile: report its version
  let at: { target: string | null; curve: string | null } = { target: null, curve: null };
  try {
    const { curves } = readSource(await readContentAddressed(d.storage.s3, d.storage.bucket, row.sourceKey));
    const pack = await bakes.packOfBake(row.packId as string);
    if (!pack) return { kind: 'gone' };
    const stored: Omit<ArtifactDto, 'id'>[] = [{ profileName: null, format: 'source', fileName: 'source.json', mediaType: 'application/json', key: row.sourceKey, sha256: row.sourceSha256, size: row.sourceSize }];
    const summary = [];
    for (let i = 0; i < row.profiles.length; i++) {
      const profile = row.profiles[i]!;
      at = { target: profile.name, curve: null };
      await breathe();
      const target = buildTarget(curves, profile, pack.slug);
      summary.push(target.summary);
      for (const o of target.objects) {
        let s;
        try {
          s = await putContentAddressed(d.storage.s3, d.storage.bucket, o.bytes, o.mediaType);
        } catch (err) {
          throw new Error(`could not store the ${profile.name} ${o.format} output: ${(err as Error).message}`);
        }
        stored.push({ profileName: o.profileName, format: o.format, fileName: o.fileName, mediaType: o.mediaType, key: s.key, sha256: s.sha256, size: s.size });
      }
      await bakes.setProgress(bakeId, i + 1);
      if (d.delayMs) await sleep(d.delayMs);
    }
    const done = await bakes.completeBake(bakeId, {
      packId: row.packId as string, changelog: row.changelog, proposedBy: row.proposedBy, curveCount: row.curveCount,
      source: { key: row.sourceKey, sha256: row.sourceSha256, size: row.sourceSize }, bakeSummary: summary, artifacts: stored,
    });
    return { kind: 'done', created: done.created, version: done.version, bakeId, proposedBy: row.proposedBy };
  } catch (err) {
    const failure = err instanceof CurveBakeError
      ? { target: err.target, curve: err.curve, reason: err.message }
      : { target: at.target, curve: at.curve, reason: at.target ? (err as Error).message : `could not read the proposal's source: ${(err as Error).message}` };
    const bake = await bakes.recordFailure(bakeId, failure, opts.final);
    return { kind: 'failed', failure, bake };
  }
}
