import { Router, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import Papa from 'papaparse';
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';
import {
  columnForField,
  csvRowToCandidate,
  IMPORT_MAX_ROWS,
  importTemplateCsv,
  publicRowsToCsv,
  publicRowsToGeoJson,
  unknownColumns,
  type CsvCellError,
} from '../../shared/domain/report-csv';
import {
  createReportInputSchema,
  importResultSchema,
  mergedReportSchema,
  PHOTO_MAX_BYTES,
  PHOTOS_PER_REPORT,
  photoListSchema,
  reasonInputSchema,
  reportFilterSchema,
  reportListQuerySchema,
  reportListSchema,
  reportResponseSchema,
  treeListSchema,
  updateReportInputSchema,
  type CreateReportValues,
} from '../../shared/schemas/reports';
import { recordAudit } from '../audit/audit.repo';
import type { Db } from '../db/client';
import { writeBatcher } from '../db/write-batcher';
import { reportFlags } from '../db/schema';
import type { Config } from '../lib/config';
import { HttpError, notFound } from '../lib/http-error';
import { requireRole, requireSignedIn } from '../middleware/require-role';
import { PHOTO_UPLOAD_LIMIT, processPhoto, removePhotoFiles, storePhoto, type ProcessedPhoto } from '../photos/photos';
import { retryAfterSeconds, takeAllowance, type AllowanceLimit } from '../lib/allowance';
import { publishDraft } from './publish';
import {
  canView,
  deletePhotoRow,
  deleteReportRow,
  exportPublicRows,
  findPhotoRow,
  findReportRow,
  findTreeByLabel,
  findVarietyByName,
  insertFlag,
  insertPhotoRow,
  insertReport,
  listReports,
  listTrees,
  openFlagBy,
  photoCount,
  photosOf,
  reportColumns,
  resolveTree,
  resolveVariety,
  seasonDetails,
  toNewReport,
  toReport,
  updateReportRow,
  type ReportRow,
  reportIdForClientId,
  rememberClientId,
} from './reports.repo';
import { reportClientIdInputSchema } from '../../shared/schemas/report-outbox';
import { setLicenceHeaders } from '../lib/data-licence-headers';
import { idParamsSchema, pathId } from '../lib/path-params';

const photoParamsSchema = z.object({ id: pathId, photoId: pathId });

export const DRAFT_NOTICE = 'Saved as a draft: it will be published once your e-mail address is verified. Only you can see it until then.';
const CSV_MAX_BYTES = 2 * 1024 * 1024;

/** Turn multer's limit errors into answers that say what to do. */
function runMulter(handler: RequestHandler, field: string, maxBytes: number): RequestHandler {
  return (req, res, next) => {
    handler(req, res, (error?: unknown) => {
      if (!error) return next();
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'file_too_large', `Each file may be at most ${Math.round(maxBytes / 1024 / 1024)} MB`, { [field]: [`A file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB`] }));
        if (error.code === 'LIMIT_FILE_COUNT') return next(new HttpError(400, 'too_many_files', `At most ${PHOTOS_PER_REPORT} files at once`, { [field]: [`At most ${PHOTOS_PER_REPORT} files at once`] }));
        return next(new HttpError(400, 'bad_upload', `Send the file in the form field “${field}”`, { [field]: [error.message] }));
      }
      next(error);
    });
  };
}

/** Refuse an upload by its declared size before reading it. */
const refuseLargerThan =
  (maxBytes: number, field: string): RequestHandler =>
  (req, _res, next) => {
    const declared = Number(req.get('content-length') ?? 0);
    if (declared > maxBytes) throw new HttpError(413, 'file_too_large', `The upload is larger than ${Math.round(maxBytes / 1024 / 1024)} MB`, { [field]: ['The upload is too large'] });
    next();
  };

/** Harvest reports: posting, editing, photos, moderation, CSV import and public exports. */
export interface ReportsRouterDeps {
  db: Db;
  config: Config;
  /** Photos one account may send per window (default PHOTO_UPLOAD_LIMIT: 60 an hour). */
  photoUploadLimit?: AllowanceLimit;
}

export function createReportsRouter({ db, config, photoUploadLimit = PHOTO_UPLOAD_LIMIT }: ReportsRouterDeps): Router {
  const router = Router();
  /** Take `count` photos from the account's hourly allowance (0: only check it is not used up), else 429 with Retry-After. */
  const photoAllowance = (res: Response, userId: number, count: number) => {
    const taken = takeAllowance(db, `photo-upload:${userId}`, count, photoUploadLimit);
    if (taken.ok) return;
    const wait = retryAfterSeconds(taken.resetAt);
    res.set('Retry-After', String(wait));
    const left = Math.max(0, photoUploadLimit.limit - taken.used);
    throw new HttpError(429, 'rate_limited', `An account may send ${photoUploadLimit.limit} photos an hour; try again in ${Math.ceil(wait / 60)} minutes`, {
      photos: [left > 0 ? `Only ${left} more photo${left === 1 ? '' : 's'} this hour` : `No more photos this hour; try again in ${Math.ceil(wait / 60)} minutes`],
    });
  };
  const photoUpload = runMulter(
    multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: PHOTOS_PER_REPORT, fields: 10 } }).array('photos', PHOTOS_PER_REPORT),
    'photos',
    PHOTO_MAX_BYTES,
  );
  const csvUpload = runMulter(multer({ storage: multer.memoryStorage(), limits: { fileSize: CSV_MAX_BYTES, files: 1, fields: 10 } }).single('file'), 'file', CSV_MAX_BYTES);

  /** A report the viewer may see (else 404, so hidden reports stay unknown). */
  const visibleReport = (id: number, viewer: Express.User | undefined): ReportRow => {
    const row = findReportRow(db, id);
    if (!row || !canView(row, viewer)) throw notFound('Report');
    return row;
  };
  /** A report only its author may change (403 for anyone else who can see it). */
  const ownReport = (id: number, viewer: Express.User): ReportRow => {
    const row = visibleReport(id, viewer);
    if (row.userId !== viewer.id) throw new HttpError(403, 'forbidden', 'Only the grower who wrote this report can change it');
    return row;
  };

  // ---------------------------------------------------------------- reads

  router.get('/', (req, res) => {
    const query = reportListQuerySchema.parse(req.query);
    if (query.mine && !req.user) throw new HttpError(401, 'unauthenticated', 'Please sign in first');
    const { reports, total } = listReports(db, query, req.user);
    res.json(reportListSchema.parse({ reports, total, page: query.page, pageSize: query.pageSize }));
  });

  router.get('/trees', requireSignedIn, (req, res) => {
    res.json(treeListSchema.parse({ trees: listTrees(db, req.user!.id) }));
  });

  router.get('/export.csv', (req, res) => {
    const rows = exportPublicRows(db, reportFilterSchema.parse(req.query));
    setLicenceHeaders(res);
    res.type('text/csv; charset=utf-8').attachment('syconium-reports.csv').send(publicRowsToCsv(rows));
  });

  router.get('/export.geojson', (req, res) => {
    const rows = exportPublicRows(db, reportFilterSchema.parse(req.query));
    setLicenceHeaders(res);
    res.type('application/geo+json').attachment('syconium-reports.geojson').send(JSON.stringify(publicRowsToGeoJson(rows)));
  });

  router.get('/import/template.csv', (_req, res) => {
    res.type('text/csv; charset=utf-8').attachment('syconium-import-template.csv').send(importTemplateCsv());
  });

  router.get('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    res.json(reportResponseSchema.parse({ report: toReport(db, visibleReport(id, req.user), req.user) }));
  });

  // ---------------------------------------------------------------- writes by the author

  router.post('/', requireSignedIn, async (req, res) => {
    const input = createReportInputSchema.parse(req.body);
    const { clientId } = reportClientIdInputSchema.parse(req.body);
    const user = req.user!;
    const status = user.emailVerified ? 'published' : 'draft';
    // Group commit: posts of the same event-loop turn share one transaction, each in its own
    // savepoint (a refused post rolls back alone); the answer waits for the shared COMMIT.
    const report = await writeBatcher(db).run(() => {
      // A re-send from the outbox (same grower, same clientId): the report stored the first time.
      const sentBefore = clientId ? reportIdForClientId(db, user.id, clientId) : undefined;
      if (sentBefore !== undefined) return { resent: sentBefore };
      const variety = resolveVariety(db, input, user.id);
      const tree = resolveTree(db, user.id, input.treeId, input.newTreeLabel, variety.name);
      const now = new Date().toISOString();
      const created = insertReport(db, { ...reportColumns(input), userId: user.id, treeId: tree.id, varietyId: variety.varietyId, proposedVarietyName: variety.proposedVarietyName, status, publishedAt: status === 'published' ? now : null, createdAt: now, updatedAt: now, updatedById: user.id });
      recordAudit(db, { actorId: user.id, action: 'report.create', entityType: 'report', entityId: created.id, after: created });
      if (clientId) rememberClientId(db, user.id, clientId, created.id);
      return toNewReport(db, created, user, { variety: variety.ref, treeLabel: tree.label });
    });
    if ('resent' in report) {
      const stored = findReportRow(db, report.resent)!;
      res.status(200).json(reportResponseSchema.parse({ report: toReport(db, stored, user), notice: stored.status === 'draft' ? DRAFT_NOTICE : undefined }));
      return;
    }
    res.status(201).json(reportResponseSchema.parse({ report, notice: status === 'draft' ? DRAFT_NOTICE : undefined }));
  });

  router.patch('/:id', requireSignedIn, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const user = req.user!;
    const before = ownReport(id, user);
    const parsed = updateReportInputSchema.parse(req.body ?? {});
    // Only the keys the client sent: a partial edit never resets a field to its default.
    const sent = new Set(Object.keys(req.body ?? {}));
    const patch = Object.fromEntries(Object.entries(parsed).filter(([key]) => sent.has(key)));
    if (Object.keys(patch).length === 0) {
      throw new HttpError(400, 'invalid_input', 'Send at least one field of the report to change', { _: ['Nothing to change: no known report field was sent'] });
    }
    const changesVariety = sent.has('varietyId') || sent.has('proposedVarietyName');
    const changesTree = sent.has('treeId') || sent.has('newTreeLabel');
    const merged: CreateReportValues = mergedReportSchema.parse({
      ...storedInput(before),
      ...(changesVariety ? { varietyId: null, proposedVarietyName: null } : {}),
      ...(changesTree ? { treeId: null, newTreeLabel: null } : {}),
      ...patch,
    });
    const after = db.transaction(() => {
      const variety = changesVariety ? resolveVariety(db, merged, user.id) : { varietyId: before.varietyId, proposedVarietyName: before.proposedVarietyName, name: '' };
      const treeId = changesTree ? resolveTree(db, user.id, merged.treeId, merged.newTreeLabel, variety.name || 'My fig tree').id : before.treeId;
      const updated = updateReportRow(db, id, {
        ...reportColumns(merged),
        varietyId: variety.varietyId,
        proposedVarietyName: variety.proposedVarietyName,
        treeId,
        updatedAt: new Date().toISOString(),
        updatedById: user.id,
      });
      recordAudit(db, { actorId: user.id, action: 'report.update', entityType: 'report', entityId: id, before, after: updated });
      return updated;
    });
    res.json(reportResponseSchema.parse({ report: toReport(db, after, user) }));
  });

  router.delete('/:id', requireSignedIn, async (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const user = req.user!;
    const before = ownReport(id, user);
    const files = photosOf(db, id).flatMap((p) => [p.fileName, p.thumbName]);
    db.transaction(() => {
      deleteReportRow(db, id);
      recordAudit(db, { actorId: user.id, action: 'report.delete', entityType: 'report', entityId: id, before: { ...before, photoFiles: files } });
    });
    await removePhotoFiles(config.uploadsDir, files);
    res.status(204).end();
  });

  router.post('/:id/publish', requireSignedIn, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const user = req.user!;
    const before = ownReport(id, user);
    if (before.status !== 'draft') throw new HttpError(409, 'not_a_draft', 'Only a draft can be published');
    if (!user.emailVerified) throw new HttpError(403, 'email_unverified', 'Verify your e-mail address first; then your drafts can be published');
    // Published now, so the next nearby digest includes it although it was written earlier.
    const after = db.transaction(() => publishDraft(db, before, user.id, new Date().toISOString()));
    res.json(reportResponseSchema.parse({ report: toReport(db, after, user) }));
  });

  // ---------------------------------------------------------------- moderation

  router.post('/:id/hide', requireRole('editor'), (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { reason } = reasonInputSchema.parse(req.body);
    const editor = req.user!;
    const before = visibleReport(id, editor);
    if (before.status !== 'published') throw new HttpError(409, 'not_published', 'Only a published report can be hidden');
    const after = db.transaction(() => {
      const now = new Date().toISOString();
      const updated = updateReportRow(db, id, { status: 'hidden', hiddenReason: reason, hiddenById: editor.id, hiddenAt: now, updatedAt: now, updatedById: editor.id });
      // Open flags are settled by hiding the report.
      db.update(reportFlags).set({ status: 'actioned', resolvedById: editor.id, resolvedAt: now }).where(and(eq(reportFlags.reportId, id), eq(reportFlags.status, 'open'))).run();
      recordAudit(db, { actorId: editor.id, action: 'report.hide', entityType: 'report', entityId: id, before: { status: before.status }, after: { status: 'hidden', hiddenReason: reason } });
      return updated;
    });
    res.json(reportResponseSchema.parse({ report: toReport(db, after, editor) }));
  });

  router.post('/:id/restore', requireRole('editor'), (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const editor = req.user!;
    const before = visibleReport(id, editor);
    if (before.status !== 'hidden') throw new HttpError(409, 'not_hidden', 'Only a hidden report can be restored');
    const after = db.transaction(() => {
      // publishedAt stays as it was: a restored report was public before, so no digest announces it again.
      const updated = updateReportRow(db, id, { status: 'published', hiddenReason: null, hiddenById: null, hiddenAt: null, updatedAt: new Date().toISOString(), updatedById: editor.id });
      recordAudit(db, { actorId: editor.id, action: 'report.restore', entityType: 'report', entityId: id, before: { status: 'hidden', hiddenReason: before.hiddenReason }, after: { status: 'published' } });
      return updated;
    });
    res.json(reportResponseSchema.parse({ report: toReport(db, after, editor) }));
  });

  router.post('/:id/flags', requireSignedIn, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { reason } = reasonInputSchema.parse(req.body);
    const user = req.user!;
    const report = visibleReport(id, user);
    if (report.userId === user.id) throw new HttpError(400, 'own_report', 'You cannot flag your own report; edit or delete it instead');
    if (report.status !== 'published') throw new HttpError(409, 'not_published', 'Only a published report can be flagged');
    if (openFlagBy(db, id, user.id)) throw new HttpError(409, 'already_flagged', 'You have already flagged this report; editors will look at it');
    const flag = db.transaction(() => {
      const created = insertFlag(db, { reportId: id, userId: user.id, reason });
      recordAudit(db, { actorId: user.id, action: 'report.flag', entityType: 'report', entityId: id, after: { flagId: created.id, reason } });
      return created;
    });
    res.status(201).json({ flag: { id: flag.id, status: flag.status, createdAt: flag.createdAt } });
  });

  // ---------------------------------------------------------------- photos

  router.post(
    '/:id/photos',
    requireSignedIn,
    refuseLargerThan(PHOTOS_PER_REPORT * PHOTO_MAX_BYTES + 64 * 1024, 'photos'),
    (req, res, next) => {
      // Check the author, the hourly allowance and the room left before reading any upload.
      const { id } = idParamsSchema.parse(req.params);
      ownReport(id, req.user!);
      photoAllowance(res, req.user!.id, 0);
      if (photoCount(db, id) >= PHOTOS_PER_REPORT) throw new HttpError(400, 'too_many_photos', `A report keeps at most ${PHOTOS_PER_REPORT} photos`, { photos: [`This report already has ${PHOTOS_PER_REPORT} photos; delete one first`] });
      next();
    },
    photoUpload,
    async (req, res) => {
      const { id } = idParamsSchema.parse(req.params);
      const user = req.user!;
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      if (files.length === 0) throw new HttpError(400, 'no_photo', 'Choose at least one photo', { photos: ['Choose at least one photo (JPEG, PNG or WebP)'] });
      // Every file counts before it is decoded, readable or not: decoding is what the allowance limits.
      photoAllowance(res, user.id, files.length);
      const processed: ProcessedPhoto[] = [];
      for (const file of files) processed.push(await processPhoto(file.buffer));
      const stored: { fileName: string; thumbName: string }[] = [];
      try {
        for (const photo of processed) stored.push(await storePhoto(config.uploadsDir, photo));
        db.transaction(() => {
          const existing = photoCount(db, id);
          if (existing + processed.length > PHOTOS_PER_REPORT) {
            throw new HttpError(400, 'too_many_photos', `A report keeps at most ${PHOTOS_PER_REPORT} photos`, { photos: [`Room for ${PHOTOS_PER_REPORT - existing} more photo(s)`] });
          }
          processed.forEach((photo, i) => {
            const row = insertPhotoRow(db, { reportId: id, ...stored[i]!, mime: 'image/webp', width: photo.width, height: photo.height, bytes: photo.main.length, position: existing + i });
            recordAudit(db, { actorId: user.id, action: 'report.photo.add', entityType: 'report', entityId: id, after: { photoId: row.id, fileName: row.fileName, width: row.width, height: row.height } });
          });
          updateReportRow(db, id, { updatedAt: new Date().toISOString(), updatedById: user.id });
        });
      } catch (error) {
        await removePhotoFiles(config.uploadsDir, stored.flatMap((s) => [s.fileName, s.thumbName]));
        throw error;
      }
      res.status(201).json(photoListSchema.parse({ photos: photosOf(db, id).map(({ fileName: _f, thumbName: _t, ...photo }) => photo) }));
    },
  );

  router.delete('/:id/photos/:photoId', requireSignedIn, async (req, res) => {
    const { id, photoId } = photoParamsSchema.parse(req.params);
    const user = req.user!;
    ownReport(id, user);
    const photo = findPhotoRow(db, id, photoId);
    if (!photo) throw notFound('Photo');
    db.transaction(() => {
      deletePhotoRow(db, photoId);
      updateReportRow(db, id, { updatedAt: new Date().toISOString(), updatedById: user.id });
      recordAudit(db, { actorId: user.id, action: 'report.photo.delete', entityType: 'report', entityId: id, before: { photoId, fileName: photo.fileName } });
    });
    await removePhotoFiles(config.uploadsDir, [photo.fileName, photo.thumbName]);
    res.status(204).end();
  });

  // ---------------------------------------------------------------- CSV import

  router.post('/import', requireSignedIn, refuseLargerThan(CSV_MAX_BYTES + 64 * 1024, 'file'), csvUpload, (req, res) => {
    const user = req.user!;
    if (!req.file) throw new HttpError(400, 'no_file', 'Choose a CSV file', { file: ['Choose a CSV file'] });
    const text = req.file.buffer.toString('utf8').replace(/^\uFEFF/, '');
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: 'greedy', transformHeader: (h) => h.trim() });
    const header = parsed.meta.fields ?? [];
    const unknown = unknownColumns(header);
    if (unknown.length) throw new HttpError(400, 'invalid_rows', `Unknown column(s): ${unknown.join(', ')}; nothing was imported`, { 'rows.1._': [`Unknown column(s): ${unknown.join(', ')}. Use the template's column names.`] });
    if (parsed.data.length === 0) throw new HttpError(400, 'invalid_rows', 'The file has no rows; nothing was imported', { 'rows.1._': ['The file has a header but no rows'] });
    if (parsed.data.length > IMPORT_MAX_ROWS) throw new HttpError(400, 'invalid_rows', `At most ${IMPORT_MAX_ROWS} rows per file`, { 'rows.1._': [`The file has ${parsed.data.length} rows; split it into files of at most ${IMPORT_MAX_ROWS}`] });

    const errors: CsvCellError[] = [];
    for (const problem of parsed.errors) {
      if (problem.row !== undefined) errors.push({ line: problem.row + 2, column: '_', message: problem.message });
    }
    const rows: { input: CreateReportValues; treeLabel: string; line: number }[] = [];
    parsed.data.forEach((raw, index) => {
      const line = index + 2; // the header is line 1
      const { candidate, errors: cellErrors } = csvRowToCandidate(raw, line);
      errors.push(...cellErrors);
      if (candidate.varietyName) {
        const variety = findVarietyByName(db, candidate.varietyName);
        if (variety && (variety.status === 'accepted' || variety.status === 'proposed')) candidate.input.varietyId = variety.id;
        else errors.push({ line, column: 'variety', message: `“${candidate.varietyName}” is not in the catalogue; check the spelling, or move it to proposedVarietyName to propose it` });
      }
      const result = createReportInputSchema.safeParse(candidate.input);
      if (!result.success) {
        for (const issue of result.error.issues) {
          const column = columnForField(String(issue.path[0] ?? '_'));
          if (column === 'variety' && candidate.varietyName) continue; // already explained above
          if (!errors.some((e) => e.line === line && e.column === column)) errors.push({ line, column, message: issue.message });
        }
        return;
      }
      rows.push({ input: result.data, treeLabel: candidate.treeLabel ?? '', line });
    });
    if (errors.length) {
      const fields: Record<string, string[]> = {};
      for (const e of errors) (fields[`rows.${e.line}.${e.column}`] ??= []).push(e.message);
      const badLines = new Set(errors.map((e) => e.line)).size;
      throw new HttpError(400, 'invalid_rows', `${badLines} row(s) need fixing; nothing was imported`, fields);
    }

    const status = user.emailVerified ? 'published' : 'draft';
    const reportIds = db.transaction(() => {
      const treeIds = new Map<string, number>();
      const now = new Date().toISOString();
      return rows.map(({ input, treeLabel }) => {
        const variety = resolveVariety(db, input, user.id);
        const label = treeLabel || variety.name;
        const key = label.toLowerCase(); // a cache key only; the database match uses SQLite's lower()
        let treeId = treeIds.get(key) ?? findTreeByLabel(db, user.id, label);
        if (treeId === undefined) treeId = resolveTree(db, user.id, null, label, label).id;
        treeIds.set(key, treeId);
        const created = insertReport(db, { ...reportColumns(input), userId: user.id, treeId, varietyId: variety.varietyId, proposedVarietyName: variety.proposedVarietyName, status, publishedAt: status === 'published' ? now : null, createdAt: now, updatedAt: now, updatedById: user.id });
        recordAudit(db, { actorId: user.id, action: 'report.import', entityType: 'report', entityId: created.id, after: created });
        return created.id;
      });
    });
    res.status(201).json(importResultSchema.parse({ imported: reportIds.length, reportIds, drafts: status === 'draft' ? reportIds.length : 0 }));
  });

  return router;
}

/** The stored report as create-input values, to merge an edit into. */
function storedInput(row: ReportRow): Record<string, unknown> {
  return {
    varietyId: row.varietyId,
    proposedVarietyName: row.varietyId === null ? row.proposedVarietyName : null,
    treeId: row.treeId,
    newTreeLabel: null,
    lat: row.lat,
    lon: row.lon,
    ...seasonDetails(row),
  };
}
