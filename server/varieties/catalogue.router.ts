import { Router } from 'express';
import { catalogueToCsv, parseCatalogueCsv } from '../../shared/domain/variety-csv';
import {
  catalogueImportInputSchema,
  catalogueImportResultSchema,
  catalogueQuerySchema,
  catalogueSchema,
  mergeResultSchema,
  mergeVarietyInputSchema,
  rejectVarietyInputSchema,
  varietyInputSchema,
  varietyResponseSchema,
} from '../../shared/schemas/varieties';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import { requireRole } from '../middleware/require-role';
import { acceptVariety, createVariety, exportCatalogue, importCatalogue, listCatalogue, mergeVariety, rejectVariety, updateVariety } from './catalogue.repo';
import { idParamsSchema } from '../lib/path-params';

/**
 * Editors' catalogue routes, mounted at /api/varieties ahead of the public reads (which answer
 * anything this router does not). Every route needs the editor role.
 */
export function createCatalogueRouter({ db }: { db: Db }): Router {
  const router = Router();
  const editor = requireRole('editor');

  router.get('/catalogue', editor, (req, res) => {
    res.json(catalogueSchema.parse(listCatalogue(db, catalogueQuerySchema.parse(req.query))));
  });

  router.get('/export.csv', editor, (_req, res) => {
    res.type('text/csv; charset=utf-8');
    res.attachment(`syconium-varieties-${new Date().toISOString().slice(0, 10)}.csv`);
    res.send(catalogueToCsv(exportCatalogue(db)));
  });

  router.post('/import', editor, (req, res) => {
    const { csv } = catalogueImportInputSchema.parse(req.body);
    const parsed = parseCatalogueCsv(csv);
    if (!parsed.ok) {
      const fields: Record<string, string[]> = {};
      for (const p of parsed.problems) (fields[`row ${p.row}.${p.column}`] ??= []).push(p.message);
      throw new HttpError(400, 'invalid_csv', `Nothing was imported: ${parsed.problems.length} problem${parsed.problems.length === 1 ? '' : 's'} in the file`, fields);
    }
    res.json(catalogueImportResultSchema.parse(importCatalogue(db, parsed.rows, req.user!.id)));
  });

  router.post('/', editor, (req, res) => {
    const input = varietyInputSchema.parse(req.body);
    res.status(201).json(varietyResponseSchema.parse({ variety: createVariety(db, input, req.user!.id) }));
  });

  router.patch('/:id', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const input = varietyInputSchema.parse(req.body);
    res.json(varietyResponseSchema.parse({ variety: updateVariety(db, id, input, req.user!.id) }));
  });

  router.post('/:id/accept', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const input = varietyInputSchema.parse(req.body);
    res.json(varietyResponseSchema.parse({ variety: acceptVariety(db, id, input, req.user!.id) }));
  });

  router.post('/:id/reject', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { reason } = rejectVarietyInputSchema.parse(req.body);
    res.json(varietyResponseSchema.parse({ variety: rejectVariety(db, id, reason, req.user!.id) }));
  });

  router.post('/:id/merge', editor, (req, res) => {
    const { id } = idParamsSchema.parse(req.params);
    const { intoId } = mergeVarietyInputSchema.parse(req.body);
    res.json(mergeResultSchema.parse(mergeVariety(db, id, intoId, req.user!.id)));
  });

  return router;
}
