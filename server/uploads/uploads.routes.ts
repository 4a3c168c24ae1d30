import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { HttpError, badRequest } from '../http/errors';
import { UPLOAD_EXTENSIONS, UPLOAD_FILES_FIELD, UPLOAD_LIMITS, extensionOf, isUploadExtension, uploadFormSchema, type UploadLimits, type UploadResponse } from '../../shared/schemas/uploads';
import { uploadFiles, uploadTarget, type UploadedFile } from './uploads.service';

/** What the file filter saw, in the order of the request's parts (refused files keep their place in the answer). */
interface Seen { name: string; accepted: boolean }

const mb = (bytes: number) => `${Math.round((bytes / (1024 * 1024)) * 100) / 100} MB`;

/**
 * multer (memory storage) with the limits; its errors become JSON naming the file and the field:
 * 413 for a file over the size limit or too many files, 400 for the rest. Nothing is stored then —
 * multer fails before the route's handler runs.
 */
function receive(limits: UploadLimits): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: { fileSize: limits.fileSize, files: limits.files, fieldSize: limits.fieldSize, fields: limits.fields, fieldNameSize: 100, parts: limits.files + limits.fields },
    fileFilter: (req, file, cb) => {
      const seen = ((req as unknown as { uploadSeen?: Seen[] }).uploadSeen ??= []);
      // a refused extension is that file's error in the answer, not the request's
      const accepted = isUploadExtension(extensionOf(file.originalname));
      seen.push({ name: file.originalname, accepted });
      cb(null, accepted);
    },
  }).array(UPLOAD_FILES_FIELD);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        const file = (err as multer.MulterError & { filename?: string }).filename;
        const field = err.field ?? UPLOAD_FILES_FIELD;
        const fail = (status: number, code: string, text: string) =>
          next(new HttpError(status, code, `${text}; nothing was stored.`, { [field]: `${field}: ${text}` }));
        switch (err.code) {
          case 'LIMIT_FILE_SIZE':
            return fail(413, 'file_too_large', `"${file ?? '?'}" is larger than ${mb(limits.fileSize)}, the limit per file`);
          case 'LIMIT_FILE_COUNT':
          case 'LIMIT_PART_COUNT':
            return fail(413, 'too_many_files', `more than ${limits.files} files in one upload`);
          case 'LIMIT_UNEXPECTED_FILE':
            return fail(400, 'invalid_request', `files go in the "${UPLOAD_FILES_FIELD}" field, not "${err.field ?? '?'}"`);
          case 'LIMIT_FIELD_VALUE':
            return fail(400, 'invalid_request', `the value is longer than ${limits.fieldSize} bytes`);
          case 'LIMIT_FIELD_COUNT':
            return fail(400, 'invalid_request', `more than ${limits.fields} form fields`);
          default:
            return fail(400, 'invalid_request', err.message);
        }
      }
      // busboy: a body that is not a well-formed multipart form
      return next(badRequest(`The upload is not a valid multipart form: ${(err as Error).message ?? String(err)}`, { [UPLOAD_FILES_FIELD]: `${UPLOAD_FILES_FIELD}: the form could not be read` }));
    });
  };
}

/**
 * Bulk upload of curve files into a pack (admins, leads, animators: curves.edit). The pack is checked
 * before the body is read, so a viewer or a missing pack never costs an upload.
 */
export function uploadRoutes(ctx: AppContext, limits: UploadLimits = UPLOAD_LIMITS): Router {
  const router = Router();
  const team = (res: Parameters<typeof teamAccessOf>[0]) => teamAccessOf(res).teamId;

  // POST /api/teams/:teamId/packs/:pack/uploads (multipart: files[], tolerance?) → 200 { results } one per file
  router.post('/teams/:teamId/packs/:pack/uploads', requireUser(), requireTeam('curves.edit'),
    async (req, res, next) => {
      res.locals.uploadPack = await uploadTarget(principalOf(res), team(res), String(req.params.pack));
      next();
    },
    receive(limits),
    async (req, res) => {
      const p = principalOf(res);
      if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
      const form = uploadFormSchema.parse(req.body ?? {});
      const accepted = (req.files as Express.Multer.File[] | undefined) ?? [];
      const seen = (req as unknown as { uploadSeen?: Seen[] }).uploadSeen ?? [];
      if (seen.length === 0) {
        throw badRequest(`${UPLOAD_FILES_FIELD}: choose at least one file (multipart/form-data, field "${UPLOAD_FILES_FIELD}")`, {
          [UPLOAD_FILES_FIELD]: `${UPLOAD_FILES_FIELD}: choose at least one ${UPLOAD_EXTENSIONS.join(', ')} file`,
        });
      }
      let cursor = 0;
      const files = seen.map((s): UploadedFile | { name: string; refused: string } => {
        if (!s.accepted) {
          const ext = extensionOf(s.name);
          return { name: s.name, refused: `"${ext || '(no extension)'}" files are not accepted; upload ${UPLOAD_EXTENSIONS.join(', ')}` };
        }
        const f = accepted[cursor++]!;
        return { name: f.originalname, bytes: new Uint8Array(f.buffer.buffer, f.buffer.byteOffset, f.buffer.byteLength) };
      });
      const outcome = await uploadFiles(res.locals.uploadPack, files, form.tolerance);
      if (outcome.counts.curves > 0) {
        const pack = outcome.pack;
        await ctx.events.publish({
          type: 'curves.uploaded', teamId: team(res), actorId: p.user.id, pack: { id: pack.id, slug: pack.slug, name: pack.name },
          subject: { kind: 'pack', id: pack.id, label: pack.slug },
          data: { ...outcome.counts, tolerance: form.tolerance },
        });
      }
      const body: UploadResponse = { results: outcome.results };
      res.json(body);
    });

  return router;
}
