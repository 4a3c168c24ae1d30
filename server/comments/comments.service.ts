/**
 * Comments on a pack version. A pinned comment names a curve of that version (as stored in its source,
 * read back from the bucket) and optionally a time inside the curve's domain, [first key, last key]
 * (shared/curve/types.ts). Nothing is stored when either check fails.
 */
import type { Principal } from '../auth/principal';
import { badRequest } from '../http/errors';
import { readContentAddressed } from '../storage/content-store';
import { getVersion, type Storage } from '../versions/versions.service';
import type { CurveDocument } from '../../shared/curve';
import type { CommentDto } from '../../shared/schemas/comments';
import type { VersionDto } from '../../shared/schemas/versions';
import * as repo from './comments.repository';

async function curvesOf(storage: Storage, v: VersionDto): Promise<CurveDocument[]> {
  const bytes = await readContentAddressed(storage.s3, storage.bucket, v.source.key);
  return (JSON.parse(new TextDecoder().decode(bytes)) as { curves: CurveDocument[] }).curves;
}

export async function listComments(p: Principal, teamId: string, slug: string, number: number): Promise<CommentDto[]> {
  const v = await getVersion(p, teamId, slug, number);
  return repo.listComments(v.id);
}

export async function addComment(
  storage: Storage, p: Principal, teamId: string, slug: string, number: number, authorId: string,
  input: { body: string; curve?: string | null; time?: number | null },
): Promise<{ version: VersionDto; comment: CommentDto }> {
  const version = await getVersion(p, teamId, slug, number);
  const curveName = input.curve ?? null;
  const time = input.time ?? null;
  if (curveName !== null) {
    const curve = (await curvesOf(storage, version)).find((c) => c.name === curveName);
    if (!curve) throw badRequest(`curve: v${number} of "${slug}" has no curve "${curveName}"`, { curve: `curve: v${number} has no curve "${curveName}"` });
    if (time !== null) {
      const from = curve.keys[0]!.time;
      const to = curve.keys[curve.keys.length - 1]!.time;
      if (time < from || time > to) throw badRequest(`time: must be inside ${curveName}'s domain, ${from}–${to} s`, { time: `time: must be between ${from} and ${to} s` });
    }
  }
  // review_id stays null here: it links comments a review form sends with its decision (not yet used)
  const comment = await repo.insertComment({ versionId: version.id, authorId, body: input.body, curveName, time, reviewId: null });
  return { version, comment };
}
