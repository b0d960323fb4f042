/** /api/projects/:id/files and the survey parse endpoint. Bytes live in the `files` table. */
import type { RequestHandler } from 'express';
import { and, desc, eq } from 'drizzle-orm';
import multer from 'multer';
import { z } from 'zod';
import { files, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { detectSurveyFormat, parseSurvey, SurveyError, type SurveyFormat, type SurveyParse } from '../survey';
import { uuidParam } from '../ids';
import { projectOf } from '../project-scope';

const MB = 1024 * 1024;
export const BACKDROP_MAX_BYTES = 8 * MB;
export const SURVEY_MAX_BYTES = 2 * MB;

const uploadBody = z.object({ kind: z.enum(['backdrop', 'survey'], { error: 'must be backdrop or survey' }) });
const renameBody = z
  .object({
    filename: z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters'),
  })
  .strict();

/**
 * The stored name for a rename: cleaned like an upload's, and keeping the old extension when the
 * new name has none (so a download still opens in the right program).
 */
export function renamedFilename(typed: string, old: string): string {
  const ext = /\.[A-Za-z0-9]{1,8}$/.exec(old)?.[0] ?? '';
  const name = /\.[A-Za-z0-9]{1,8}$/.test(typed) ? typed : typed + ext;
  return safeFilename(name);
}

/** PNG and JPEG by their magic bytes (PNG spec §5.2; JPEG SOI marker FF D8 FF). */
export function imageType(bytes: Buffer): 'image/png' | 'image/jpeg' | null {
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  return null;
}

/** One file in field `file`, at most `maxBytes`, kept in memory; 413 above the limit. */
export function singleFile(maxBytes: number): RequestHandler {
  // Browsers send the filename as raw UTF-8 (WHATWG multipart form-data encoding); multer's default reads it as latin1.
  const upload = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: { fileSize: maxBytes, files: 1, fields: 10 },
  }).single('file');
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      return next(new ApiError('unsupported-type', 'Send the file as multipart/form-data in field "file"'));
    }
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new ApiError('too-large', `The file is larger than ${maxBytes / MB} MB`));
        return next(new ApiError('validation', `Upload rejected: ${err.message}`, { fields: [{ path: err.field ?? 'file', message: err.message }] }));
      }
      // busboy's own errors: no boundary, a truncated body, a malformed part header.
      if (err instanceof Error && /^(Multipart|Unexpected end of form|Malformed)/.test(err.message)) {
        return next(
          new ApiError('validation', `The multipart body is malformed: ${err.message}`, {
            fields: [{ path: 'file', message: 'send one file as multipart/form-data' }],
          }),
        );
      }
      next(err);
    });
  };
}

/**
 * Content-Disposition for a stored file name (RFC 6266 §4.3): an ASCII `filename` fallback and the
 * exact name as UTF-8 in `filename*` (RFC 8187). A raw non-Latin-1 name would make Node refuse the header.
 */
export function contentDisposition(type: 'inline' | 'attachment', filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  const encoded = encodeURIComponent(filename).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}

/** `contentDisposition('inline', …)`; kept for existing callers (takeoff exports). */
export function inlineDisposition(filename: string): string {
  return contentDisposition('inline', filename);
}

/**
 * Uploads get their own CSP, stricter than the app's: a verified image may show itself and nothing
 * else; anything else is sandboxed and loads nothing, should a browser ever render it.
 */
export const IMAGE_CSP = "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox";
export const DOWNLOAD_CSP = "default-src 'none'; sandbox";

/** A stored file name: no path separators, quotes, control characters or lone surrogates; at most 200 characters. */
export function safeFilename(name: string): string {
  // Control characters are exactly what is being removed.
  // eslint-disable-next-line no-control-regex
  const cleaned = name.replace(/[\\/"\u0000-\u001f\u007f]/g, '_').replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '_');
  return Array.from(cleaned).slice(0, 200).join('') || 'upload';
}

export function requireFile(file: Express.Multer.File | undefined): Express.Multer.File {
  if (!file) throw new ApiError('validation', 'No file uploaded', { fields: [{ path: 'file', message: 'is required (multipart field "file")' }] });
  return file;
}

/** CSV or GPX by content (survey/index.ts), or 415 for binary content. */
function surveyFormatOf(file: Express.Multer.File): SurveyFormat {
  const format = detectSurveyFormat(file.buffer);
  if (!format) throw new ApiError('unsupported-type', `A survey must be a CSV or GPX text file; "${file.originalname}" is binary`);
  return format;
}

/** The survey's points, or 400 naming the line or point: only a file that parses is stored or answered. */
function parsedSurvey(file: Express.Multer.File): SurveyParse {
  const format = surveyFormatOf(file);
  try {
    return parseSurvey(file.buffer.toString('utf8'), format);
  } catch (err) {
    if (err instanceof SurveyError) throw new ApiError('validation', err.message, err.where);
    throw err;
  }
}

function fileJson(row: { id: string; kind: string; filename: string; mime: string; size: number; createdAt: Date; createdByName: string | null }) {
  return {
    id: row.id,
    kind: row.kind,
    filename: row.filename,
    mime: row.mime,
    size: row.size,
    createdAt: row.createdAt.toISOString(),
    createdBy: row.createdByName ?? null,
  };
}

const listColumns = {
  id: files.id,
  kind: files.kind,
  filename: files.filename,
  mime: files.mime,
  size: files.size,
  createdAt: files.createdAt,
  createdByName: users.name,
};

export function fileRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/files', 'files.read', async (req, res) => {
    const project = projectOf(req);
    const rows = await db
      .select(listColumns)
      .from(files)
      .leftJoin(users, eq(users.id, files.createdBy))
      .where(eq(files.projectId, project.id))
      .orderBy(desc(files.createdAt));
    res.json(rows.map(fileJson));
  });

  api.post('/projects/:id/files', 'files.write', singleFile(BACKDROP_MAX_BYTES), async (req, res) => {
    const project = projectOf(req);
    const { kind } = parseBody(uploadBody, req.body);
    const file = requireFile(req.file);
    let mime: string;
    if (kind === 'backdrop') {
      const type = imageType(file.buffer);
      if (!type) throw new ApiError('unsupported-type', `A backdrop must be a PNG or JPEG image; "${file.originalname}" is neither`);
      mime = type;
    } else {
      if (file.size > SURVEY_MAX_BYTES) throw new ApiError('too-large', `A survey file must be at most ${SURVEY_MAX_BYTES / MB} MB`);
      mime = parsedSurvey(file).format === 'gpx' ? 'application/gpx+xml' : 'text/csv';
    }
    const filename = safeFilename(file.originalname);
    const row = await db.transaction(async (tx) => {
      const [created] = await tx
        .insert(files)
        .values({
          projectId: project.id,
          kind,
          filename,
          mime,
          size: file.size,
          bytes: file.buffer,
          createdBy: req.user!.id,
        })
        .returning({ id: files.id, kind: files.kind, filename: files.filename, mime: files.mime, size: files.size, createdAt: files.createdAt });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'file.upload',
        target: filename,
        detail: { projectId: project.id, kind, size: file.size },
      });
      return created;
    });
    res.status(201).json(fileJson({ ...row, createdByName: req.user!.name }));
  });

  api.get('/projects/:id/files/:fileId', 'files.read', async (req, res) => {
    const project = projectOf(req);
    const fileId = uuidParam(req.params.fileId, 'No such file');
    const [row] = await db
      .select()
      .from(files)
      .where(and(eq(files.id, fileId), eq(files.projectId, project.id)));
    if (!row) throw new ApiError('not-found', 'No such file');
    // Shown in the page only when the bytes are an image we checked; everything else downloads.
    const image = (row.kind === 'backdrop' || row.kind === 'photo') && imageType(row.bytes) === row.mime;
    res.setHeader(
      'Content-Type',
      image ? row.mime : `${row.mime === 'text/csv' || row.mime === 'application/gpx+xml' ? row.mime : 'application/octet-stream'}`,
    );
    res.setHeader('Content-Disposition', contentDisposition(image ? 'inline' : 'attachment', row.filename));
    res.setHeader('Content-Security-Policy', image ? IMAGE_CSP : DOWNLOAD_CSP);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Cross-Origin-Resource-Policy', 'same-origin');
    res.send(row.bytes);
  });

  api.patch('/projects/:id/files/:fileId', 'files.write', async (req, res) => {
    const project = projectOf(req);
    const fileId = uuidParam(req.params.fileId, 'No such file');
    const { filename: typed } = parseBody(renameBody, req.body);
    const row = await db.transaction(async (tx) => {
      const [old] = await tx
        .select({ filename: files.filename })
        .from(files)
        .where(and(eq(files.id, fileId), eq(files.projectId, project.id)));
      if (!old) throw new ApiError('not-found', 'No such file');
      const filename = renamedFilename(typed, old.filename);
      const [updated] = await tx.update(files).set({ filename }).where(eq(files.id, fileId)).returning({
        id: files.id,
        kind: files.kind,
        filename: files.filename,
        mime: files.mime,
        size: files.size,
        createdAt: files.createdAt,
        createdBy: files.createdBy,
      });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'file.rename',
        target: filename,
        detail: { projectId: project.id, from: old.filename },
      });
      return updated;
    });
    const [who] = row.createdBy ? await db.select({ name: users.name }).from(users).where(eq(users.id, row.createdBy)) : [];
    res.json(fileJson({ ...row, createdByName: who?.name ?? null }));
  });

  /** A stored survey's points, for the Files tab's preview (the same parse the upload passed). */
  api.get('/projects/:id/files/:fileId/points', 'files.read', async (req, res) => {
    const project = projectOf(req);
    const fileId = uuidParam(req.params.fileId, 'No such file');
    const [row] = await db
      .select({ kind: files.kind, bytes: files.bytes })
      .from(files)
      .where(and(eq(files.id, fileId), eq(files.projectId, project.id)));
    if (!row) throw new ApiError('not-found', 'No such file');
    if (row.kind !== 'survey') throw new ApiError('unsupported-type', 'Only a survey file has points');
    const format = detectSurveyFormat(row.bytes);
    if (!format) throw new ApiError('unsupported-type', 'The stored survey is not text');
    try {
      res.json(parseSurvey(row.bytes.toString('utf8'), format));
    } catch (err) {
      if (err instanceof SurveyError) throw new ApiError('validation', err.message, err.where);
      throw err;
    }
  });

  api.delete('/projects/:id/files/:fileId', 'files.write', async (req, res) => {
    const project = projectOf(req);
    const fileId = uuidParam(req.params.fileId, 'No such file');
    await db.transaction(async (tx) => {
      const [row] = await tx
        .delete(files)
        .where(and(eq(files.id, fileId), eq(files.projectId, project.id)))
        .returning({ filename: files.filename });
      if (!row) throw new ApiError('not-found', 'No such file');
      await audit(tx, { teamId: project.teamId, user: req.user!, action: 'file.delete', target: row.filename, detail: { projectId: project.id } });
    });
    res.status(204).end();
  });

  api.post('/projects/:id/survey/parse', 'files.read', singleFile(SURVEY_MAX_BYTES), async (req, res) => {
    res.json(parsedSurvey(requireFile(req.file)));
  });
}
