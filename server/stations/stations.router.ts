import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { freezeNoteWords } from '../../shared/domain/climate-normals';
import { bulkImportFieldsSchema, normalsReleasesSchema, normalsStationSchema, stationDetailSchema, stationListSchema, stationUploadFieldsSchema, type BulkImportLine } from '../../shared/schemas/stations';
import { detectKind, expandFiles, prepareBulkImport, writeBulkImport } from './bulk-import';
import { findNormalsStation, listNormalsReleases } from '../normals/normals.repo';
import type { Db } from '../db/client';
import { HttpError, notFound } from '../lib/http-error';
import { refuseLargeUpload } from '../middleware/refuse-large-body';
import { requireRole } from '../middleware/require-role';
import { computeStationData } from './station-import';
import { deleteStation, findStationDetail, listStations, saveStation } from './stations.repo';
import { idParamsSchema } from '../lib/path-params';

const normalsCodeSchema = z.object({ code: z.string().regex(/^[A-Z0-9]{1,20}$/, { message: 'code must be a station id such as USW00014735' }) });

/** A century of daily rows is about 4 MB of CSV; leave room for wide files. */
export const STATION_FILE_LIMIT_BYTES = 25 * 1024 * 1024;

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: STATION_FILE_LIMIT_BYTES, files: 1, fields: 12 } });

/** A declared length over the limit is refused unread; a chunked body is cut off at the limit by multer. */
const refuseLargeFile = refuseLargeUpload(STATION_FILE_LIMIT_BYTES, 'file');

/**
 * multer's own errors become answers that name the field: 413 for a file over the limit (a body
 * sent chunked, without a length to refuse it by early; multer reads and discards the rest first,
 * and the server's request timeout bounds that), 400 for anything else.
 */
const receiveFile: RequestHandler = (req, res, next) => {
  upload.single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        const message = `The file is larger than ${STATION_FILE_LIMIT_BYTES / 1024 / 1024} MB, the most an upload may be`;
        return next(new HttpError(413, 'file_too_large', message, { [err.field ?? 'file']: [message] }));
      }
      const message = `The upload was not accepted (${err.message})`;
      return next(new HttpError(400, 'invalid_upload', message, { [err.field ?? 'file']: [message] }));
    }
    next(err);
  });
};

/** A bulk import's files: a normals set is ~2 MB, a zip of GHCN-Daily stations can be large. */
export const BULK_FILE_LIMIT_BYTES = 100 * 1024 * 1024;
export const BULK_MAX_FILES = 40;

const bulkUpload = multer({ storage: multer.memoryStorage(), limits: { fileSize: BULK_FILE_LIMIT_BYTES, files: BULK_MAX_FILES, fields: 4 } });

const receiveFiles: RequestHandler = (req, res, next) => {
  bulkUpload.array('files', BULK_MAX_FILES)(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      const message =
        err.code === 'LIMIT_FILE_SIZE'
          ? `A file is larger than ${BULK_FILE_LIMIT_BYTES / 1024 / 1024} MB, the most one may be`
          : err.code === 'LIMIT_FILE_COUNT'
            ? `At most ${BULK_MAX_FILES} files at once; put more in a .zip`
            : `The upload was not accepted (${err.message})`;
      return next(new HttpError(err.code === 'LIMIT_FILE_SIZE' ? 413 : 400, err.code === 'LIMIT_FILE_SIZE' ? 'file_too_large' : 'invalid_upload', message, { files: [message] }));
    }
    next(err);
  });
};

/** Climate stations: public reads, editors upload (replace) and delete. */
export function createStationsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', (_req, res) => {
    res.json(stationListSchema.parse({ stations: listStations(db) }));
  });

  // Reference climate (NOAA normals), kept apart from the stations computed from daily records.
  router.get('/normals', (_req, res) => {
    res.json(normalsReleasesSchema.parse({ releases: listNormalsReleases(db) }));
  });

  router.get('/normals/:code', (req, res) => {
    const { code } = normalsCodeSchema.parse(req.params);
    const station = findNormalsStation(db, code);
    if (!station) throw notFound('Normals station');
    res.json(normalsStationSchema.parse({ ...station, freezeWords: freezeNoteWords(station.freezeNote) }));
  });

  router.get('/:id', (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const detail = findStationDetail(db, id);
    if (!detail) throw notFound('Station');
    res.json(stationDetailSchema.parse(detail));
  });

  router.post('/upload', requireRole('editor'), refuseLargeFile, receiveFile, (req, res) => {
    const fields = stationUploadFieldsSchema.parse(req.body ?? {});
    if (!req.file || req.file.size === 0) throw new HttpError(400, 'invalid_input', 'Please choose a CSV file', { file: ['Please choose a CSV file'] });
    const data = computeStationData(req.file.buffer.toString('utf8'), fields.unit, fields.lat);
    const id = saveStation(db, { name: fields.name, code: fields.code ?? null, lat: fields.lat, lon: fields.lon, elevationM: fields.elevationM ?? null }, data, req.user!.id);
    res.status(201).json(stationDetailSchema.parse(findStationDetail(db, id)));
  });

  // A whole file set (normals or GHCN-Daily stations): all or nothing, one progress line per station.
  router.post('/bulk', requireRole('editor'), refuseLargeUpload(BULK_FILE_LIMIT_BYTES * 2, 'files'), receiveFiles, async (req, res) => {
    const fields = bulkImportFieldsSchema.parse(req.body ?? {});
    const uploaded = (req.files as Express.Multer.File[] | undefined) ?? [];
    if (uploaded.length === 0 || uploaded.every((f) => f.size === 0)) throw new HttpError(400, 'invalid_input', 'Please choose the files of one set', { files: ['Please choose the files of one set'] });
    const files = expandFiles(uploaded.map((f) => ({ name: f.originalname, bytes: new Uint8Array(f.buffer) })));
    const kind = detectKind(files);
    res.status(200).type('application/x-ndjson');
    const send = (line: BulkImportLine) => res.write(`${JSON.stringify(line)}\n`);
    try {
      const prepared = await prepareBulkImport(files, kind, fields, (p) => send({ type: 'progress', ...p }));
      send({ type: 'summary', summary: writeBulkImport(db, prepared, req.user!.id) });
    } catch (error) {
      // The answer has begun: the failure is its last line (nothing was written).
      const problems = error instanceof HttpError ? Object.values(error.fields ?? {}).flat() : [];
      const status = error instanceof HttpError ? error.status : 500;
      send({ type: 'failed', status, message: error instanceof HttpError ? error.message : 'The import failed; nothing was changed.', problems });
      if (!(error instanceof HttpError)) console.error(error);
    }
    res.end();
  });

  router.delete('/:id', requireRole('editor'), (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    if (!deleteStation(db, id, req.user!.id)) throw notFound('Station');
    res.status(204).end();
  });

  return router;
}
