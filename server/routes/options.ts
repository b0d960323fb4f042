/**
 * /api/projects/:id/options: named variants of the design. Designers make them from the current
 * network, edit pipes and tanks, size them from the team's priced catalogue, delete and promote
 * one (a new network version); the owner marks the preferred one (who and when are recorded).
 * The list carries each design's comparison figures (engine/options/compare.ts).
 */
import { and, asc, eq, ne } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import {
  applyCandidate,
  applyMinorLossAllowance,
  catalogueCandidate,
  countFittings,
  minorLossAllowance,
  designDifferences,
  evaluateDesign,
  parseDocument,
  sizeNetwork,
  type NetworkDocument,
  type PipeLink,
} from '../../engine';
import { WORKING_SHARE } from '../../engine/profile';
import { designOptions, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import type { DbOrTx } from '../db';
import { ApiError, issuePath, parseBody } from '../errors';
import { uuidParam } from '../ids';
import { loadNetwork, saveNetwork } from '../network/network-store';
import { designInputs, pipeCandidates } from '../options/design-inputs';
import { projectOf } from '../project-scope';
import { versionNumber } from './versions';

const createBody = z.object({ name: z.string().trim().min(1, 'is required').max(120), notes: z.string().max(2000).default('') });
const editBody = z.object({
  name: z.string().trim().min(1).max(120).optional(),
  notes: z.string().max(2000).optional(),
  /** Change chosen runs to a catalogue series and size. */
  pipes: z
    .array(z.object({ id: z.string().min(1), series: z.string().min(1), nominal: z.string().min(1) }))
    .max(500)
    .optional(),
  /** Move tanks up or down (tank floor elevation, m). */
  tanks: z
    .array(z.object({ id: z.string().min(1), elevation_m: z.number().finite() }))
    .max(50)
    .optional(),
  document: z.unknown().optional(),
  /** Replace every pipe's typed minor-loss K by the allowance of its counted fittings (engine/takeoff). */
  countedMinorLoss: z.boolean().optional(),
});
const sizeBody = z.object({
  pipes: z.array(z.string().min(1)).max(2000).optional(),
  minPressure_m: z.number().finite().min(0).max(200).optional(),
  sameSeries: z.boolean().default(false),
  /** Share of the rating static pressure may use: the review's working limit (72 %, ASAE S376.1) unless told otherwise. */
  ratingFraction: z.number().finite().min(0.3).max(1).default(WORKING_SHARE),
});
const promoteBody = z.object({ version: versionNumber(0).optional() });

const creator = alias(users, 'creator');
const preferrer = alias(users, 'preferrer');

async function optionRows(db: DbOrTx, projectId: string) {
  return db
    .select({ o: designOptions, createdByName: creator.name, preferredByName: preferrer.name })
    .from(designOptions)
    .leftJoin(creator, eq(creator.id, designOptions.createdBy))
    .leftJoin(preferrer, eq(preferrer.id, designOptions.preferredBy))
    .where(eq(designOptions.projectId, projectId))
    .orderBy(asc(designOptions.createdAt));
}

async function oneOption(db: DbOrTx, projectId: string, raw: unknown) {
  const id = uuidParam(raw, 'No such option');
  const [row] = await db
    .select()
    .from(designOptions)
    .where(and(eq(designOptions.id, id), eq(designOptions.projectId, projectId)));
  if (!row) throw new ApiError('not-found', 'No such option');
  return row;
}

function checkDocument(doc: unknown): NetworkDocument {
  const parsed = parseDocument(doc);
  if (!parsed.ok) {
    const fields = parsed.problems.map((p) => ({ path: issuePath(['document', ...p.path]), ...(p.element ? { element: p.element } : {}), message: p.message }));
    throw new ApiError('validation', `The option's document has ${fields.length} problem${fields.length === 1 ? '' : 's'}: ${fields[0].message}`, { fields });
  }
  return parsed.doc;
}

export function optionRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  api.get('/projects/:id/options', 'options.read', async (req, res) => {
    const project = projectOf(req);
    const [network, rows, inputs] = await Promise.all([loadNetwork(db, project.id), optionRows(db, project.id), designInputs(db, project.teamId, project.id)]);
    const current = network.document as NetworkDocument;
    const summary = (doc: NetworkDocument) => {
      try {
        return evaluateDesign(doc, inputs).summary;
      } catch {
        return null;
      }
    };
    res.json({
      // Money on the Options screen is in the currency the estimator keeps the prices and estimate in.
      currency: inputs.settings.currency,
      current: { version: network.version, summary: current.nodes.length ? summary(current) : null },
      options: rows.map(({ o, createdByName, preferredByName }) => ({
        id: o.id,
        name: o.name,
        notes: o.notes,
        baseVersion: o.baseVersion,
        createdAt: o.createdAt.toISOString(),
        createdBy: createdByName ?? null,
        updatedAt: o.updatedAt.toISOString(),
        preferred: o.preferred,
        preferredAt: o.preferredAt?.toISOString() ?? null,
        preferredBy: preferredByName ?? null,
        promotedVersion: o.promotedVersion,
        sizing: o.sizing,
        summary: summary(o.document as NetworkDocument),
        differences: designDifferences(current, o.document as NetworkDocument),
      })),
    });
  });

  api.get('/projects/:id/options/:optionId', 'options.read', async (req, res) => {
    const row = await oneOption(db, projectOf(req).id, req.params.optionId);
    res.json({
      id: row.id,
      name: row.name,
      notes: row.notes,
      baseVersion: row.baseVersion,
      document: row.document,
      sizing: row.sizing,
      preferred: row.preferred,
    });
  });

  api.post('/projects/:id/options', 'options.write', async (req, res) => {
    const body = parseBody(createBody, req.body);
    const project = projectOf(req);
    const network = await loadNetwork(db, project.id);
    if (network.version === 0) throw new ApiError('conflict', 'Save a network first: an option is made from the current design');
    const row = await db.transaction(async (tx) => {
      const [r] = await tx
        .insert(designOptions)
        .values({
          projectId: project.id,
          name: body.name,
          notes: body.notes,
          baseVersion: network.version,
          document: network.document,
          createdBy: req.user!.id,
          updatedBy: req.user!.id,
        })
        .returning({ id: designOptions.id });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'option.create',
        target: `${project.name} / ${body.name}`,
        detail: { version: network.version },
      });
      return r;
    });
    res.status(201).json({ id: row.id, name: body.name, baseVersion: network.version });
  });

  api.patch('/projects/:id/options/:optionId', 'options.write', async (req, res) => {
    const project = projectOf(req);
    const row = await oneOption(db, project.id, req.params.optionId);
    const body = parseBody(editBody, req.body);
    let doc = body.document !== undefined ? checkDocument(body.document) : (row.document as NetworkDocument);
    if (body.pipes || body.tanks) {
      doc = { ...doc, links: [...doc.links], nodes: [...doc.nodes] };
      body.pipes?.forEach((change, i) => {
        const k = doc.links.findIndex((l) => l.id === change.id && l.kind === 'pipe');
        if (k < 0)
          throw new ApiError('validation', `pipes.${i}.id: ${change.id} is not a pipe of this option`, {
            fields: [{ path: `pipes.${i}.id`, message: 'is not a pipe of this option' }],
          });
        const cand = catalogueCandidate(change.series, change.nominal, 0, doc.headloss);
        if (!cand)
          throw new ApiError('validation', `pipes.${i}.nominal: ${change.nominal} is not a size of ${change.series}`, {
            fields: [{ path: `pipes.${i}.nominal`, message: 'is not a catalogue size of that series' }],
          });
        doc.links[k] = applyCandidate(doc.links[k] as PipeLink, cand);
      });
      body.tanks?.forEach((change, i) => {
        const k = doc.nodes.findIndex((n) => n.id === change.id && n.kind === 'tank');
        if (k < 0)
          throw new ApiError('validation', `tanks.${i}.id: ${change.id} is not a tank of this option`, {
            fields: [{ path: `tanks.${i}.id`, message: 'is not a tank of this option' }],
          });
        doc.nodes[k] = { ...doc.nodes[k], elevation_m: change.elevation_m };
      });
      doc = checkDocument(doc);
    }
    if (body.countedMinorLoss) {
      const inputs = await designInputs(db, project.teamId, project.id);
      doc = applyMinorLossAllowance(
        doc,
        minorLossAllowance(doc, countFittings(doc, { bendAngle_deg: inputs.settings.bendAngle_deg }), inputs.settings.waste_fraction),
      );
    }
    await db.transaction(async (tx) => {
      await tx
        .update(designOptions)
        .set({
          name: body.name ?? row.name,
          notes: body.notes ?? row.notes,
          document: doc,
          updatedAt: new Date(),
          updatedBy: req.user!.id,
          sizing: body.pipes || body.tanks || body.document !== undefined || body.countedMinorLoss ? null : row.sizing,
        })
        .where(eq(designOptions.id, row.id));
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'option.update',
        target: `${project.name} / ${body.name ?? row.name}`,
        detail: {
          pipes: body.pipes?.length ?? 0,
          tanks: body.tanks?.length ?? 0,
          document: body.document !== undefined,
          countedMinorLoss: body.countedMinorLoss ?? false,
        },
      });
    });
    res.json({ id: row.id, name: body.name ?? row.name, document: doc });
  });

  api.post('/projects/:id/options/:optionId/size', 'options.write', async (req, res) => {
    const project = projectOf(req);
    const row = await oneOption(db, project.id, req.params.optionId);
    const body = parseBody(sizeBody, req.body);
    const doc = row.document as NetworkDocument;
    const inputs = await designInputs(db, project.teamId, project.id);
    const candidates = pipeCandidates(inputs.prices, doc.headloss);
    if (candidates.length === 0) throw new ApiError('conflict', 'The team price list has no priced pipe: an estimator adds pipe prices first');
    for (const id of body.pipes ?? [])
      if (!doc.links.some((l) => l.id === id && l.kind === 'pipe'))
        throw new ApiError('validation', `pipes: ${id} is not a pipe of this option`, { fields: [{ path: 'pipes', message: `${id} is not a pipe` }] });
    const result = sizeNetwork(doc, candidates, {
      pipes: body.pipes,
      minPressure_m: body.minPressure_m,
      sameSeries: body.sameSeries,
      ratingFraction: body.ratingFraction,
      cover_m: inputs.cover_m,
    });
    const { document, ...report } = result;
    const sizing = { ...report, at: new Date().toISOString(), request: body };
    await db.transaction(async (tx) => {
      await tx
        .update(designOptions)
        .set({ document: result.feasible ? document : doc, sizing, updatedAt: new Date(), updatedBy: req.user!.id })
        .where(eq(designOptions.id, row.id));
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'option.size',
        target: `${project.name} / ${row.name}`,
        detail: { feasible: result.feasible, cost: result.cost },
      });
    });
    res.json(sizing);
  });

  api.post('/projects/:id/options/:optionId/promote', 'options.write', async (req, res) => {
    const project = projectOf(req);
    const row = await oneOption(db, project.id, req.params.optionId);
    const body = parseBody(promoteBody, req.body ?? {});
    const network = await loadNetwork(db, project.id);
    const saved = await saveNetwork(db, {
      projectId: project.id,
      teamId: project.teamId,
      user: req.user!,
      expectedVersion: body.version ?? network.version,
      document: row.document,
      log: ctx.log,
    });
    await db.transaction(async (tx) => {
      await tx
        .update(designOptions)
        .set({ promotedVersion: saved.version, promotedAt: new Date(), promotedBy: req.user!.id })
        .where(eq(designOptions.id, row.id));
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'option.promote',
        target: `${project.name} / ${row.name}`,
        detail: { version: saved.version },
      });
    });
    res.json({ version: saved.version });
  });

  api.post('/projects/:id/options/:optionId/prefer', 'options.prefer', async (req, res) => {
    const project = projectOf(req);
    const row = await oneOption(db, project.id, req.params.optionId);
    const now = new Date();
    await db.transaction(async (tx) => {
      await tx
        .update(designOptions)
        .set({ preferred: false })
        .where(and(eq(designOptions.projectId, project.id), ne(designOptions.id, row.id)));
      await tx.update(designOptions).set({ preferred: true, preferredAt: now, preferredBy: req.user!.id }).where(eq(designOptions.id, row.id));
      await audit(tx, { teamId: project.teamId, user: req.user!, action: 'option.prefer', target: `${project.name} / ${row.name}` });
    });
    res.json({ id: row.id, preferred: true, preferredAt: now.toISOString(), preferredBy: req.user!.name ?? null });
  });

  api.delete('/projects/:id/options/:optionId', 'options.write', async (req, res) => {
    const project = projectOf(req);
    const row = await oneOption(db, project.id, req.params.optionId);
    await db.transaction(async (tx) => {
      await tx.delete(designOptions).where(eq(designOptions.id, row.id));
      await audit(tx, { teamId: project.teamId, user: req.user!, action: 'option.delete', target: `${project.name} / ${row.name}` });
    });
    res.status(204).end();
  });
}
