/** /api/prices: the current team's price list (estimators and admins edit; everyone reads). */
import { and, eq } from 'drizzle-orm';
import multer from 'multer';
import type { RequestHandler } from 'express';
import { z } from 'zod';
import { priceItems } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import { ApiError, parseBody } from '../errors';
import { uuidParam } from '../ids';
import { parsePriceFile } from '../prices/price-import';
import { importPrices, listPrices } from '../prices/price-store';

const price = z.number({ error: 'must be a number or null' }).finite().min(0, 'must be ≥ 0').nullable();
const createBody = z.object({
  code: z.string().trim().min(1, 'is required').max(120),
  description: z.string().trim().max(300).default(''),
  unit: z.string().trim().min(1).max(30).default('each'),
  price,
});
const updateBody = z
  .object({ description: z.string().trim().max(300).optional(), unit: z.string().trim().min(1).max(30).optional(), price: price.optional() })
  .refine((b) => Object.keys(b).length > 0, 'give description, unit or price');

const upload: RequestHandler = (req, res, next) =>
  multer({ storage: multer.memoryStorage(), limits: { fileSize: 2 * 1024 * 1024, files: 1 } }).single('file')(req, res, (err: unknown) => {
    if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') return next(new ApiError('too-large', 'A price list must be at most 2 MB'));
    next(err);
  });

function teamOf(req: Parameters<RequestHandler>[0]): string {
  return req.membership!.teamId;
}

export function priceRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/prices', 'prices.read', async (req, res) => {
    res.json(await listPrices(db, teamOf(req)));
  });

  api.post('/prices', 'prices.write', async (req, res) => {
    const body = parseBody(createBody, req.body);
    const teamId = teamOf(req);
    const created = await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(priceItems)
        .values({ teamId, code: body.code, description: body.description, unit: body.unit, price: body.price, updatedBy: req.user!.id })
        .onConflictDoNothing()
        .returning({ id: priceItems.id });
      if (!row) return null;
      await audit(tx, { teamId, user: req.user!, action: 'prices.create', target: body.code, detail: { price: body.price } });
      return row;
    });
    if (!created)
      throw new ApiError('conflict', `${body.code} is already on the price list`, { fields: [{ path: 'code', message: 'is already on the price list' }] });
    res.status(201).json((await listPrices(db, teamId)).find((r) => r.id === created.id));
  });

  api.patch('/prices/:itemId', 'prices.write', async (req, res) => {
    const id = uuidParam(req.params.itemId, 'No such price item');
    const body = parseBody(updateBody, req.body);
    const teamId = teamOf(req);
    const updated = await db.transaction(async (tx) => {
      const [row] = await tx
        .update(priceItems)
        .set({ ...body, updatedAt: new Date(), updatedBy: req.user!.id })
        .where(and(eq(priceItems.id, id), eq(priceItems.teamId, teamId)))
        .returning({ code: priceItems.code });
      if (!row) return null;
      await audit(tx, { teamId, user: req.user!, action: 'prices.update', target: row.code, detail: body });
      return row;
    });
    if (!updated) throw new ApiError('not-found', 'No such price item');
    res.json((await listPrices(db, teamId)).find((r) => r.id === id));
  });

  api.delete('/prices/:itemId', 'prices.write', async (req, res) => {
    const id = uuidParam(req.params.itemId, 'No such price item');
    const teamId = teamOf(req);
    const gone = await db.transaction(async (tx) => {
      const [row] = await tx
        .delete(priceItems)
        .where(and(eq(priceItems.id, id), eq(priceItems.teamId, teamId)))
        .returning({ code: priceItems.code });
      if (row) await audit(tx, { teamId, user: req.user!, action: 'prices.delete', target: row.code });
      return row;
    });
    if (!gone) throw new ApiError('not-found', 'No such price item');
    res.status(204).end();
  });

  api.post('/prices/import', 'prices.write', upload, async (req, res) => {
    const file = req.file;
    if (!file)
      throw new ApiError('validation', 'No file uploaded', { fields: [{ path: 'file', message: 'is required (multipart field "file", CSV or XLSX)' }] });
    const rows = await parsePriceFile(file.originalname, file.buffer);
    res.json(await importPrices(db, teamOf(req), req.user!, rows, file.originalname));
  });
}
