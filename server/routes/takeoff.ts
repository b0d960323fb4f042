/**
 * /api/projects/:id/takeoff, its settings, the owner's acceptance of the estimate, and the
 * exports (XLSX workbook, CSV of the takeoff). `?option=<id>` prices an option instead of the
 * current design.
 */
import { and, desc, eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { z } from 'zod';
import { evaluateDesign, simulate, soldUnit, type NetworkDocument } from '../../engine';
import { designOptions, estimateAcceptances, networkVersions, takeoffSettings, users } from '../../drizzle/schema';
import type { ApiRoutes } from '../api-routes';
import { audit } from '../audit';
import type { AppContext } from '../context';
import type { DbOrTx } from '../db';
import { ApiError, parseBody } from '../errors';
import { buildWorkbook, CODES_NOTE, sheetUnits } from '../export/workbook';
import { inlineDisposition } from './files';
import { isUuid } from '../ids';
import { loadNetwork } from '../network/network-store';
import { designInputs } from '../options/design-inputs';
import { projectOf, type ProjectRow } from '../project-scope';

const share = z.number().finite().min(0).max(1);
const settingsBody = z.object({
  waste_fraction: share.max(0.5),
  bendAngle_deg: z.number().finite().min(5).max(90),
  other: z
    .array(
      z.object({
        code: z.string().trim().min(1).max(120),
        description: z.string().trim().min(1).max(300),
        unit: z.string().trim().min(1).max(30),
        quantity: z.number().finite().min(0).optional(),
        per_pipe_m: z.number().finite().min(0).optional(),
      }),
    )
    .max(100),
  labour_hours: z.number().finite().min(0).max(100000),
  labour_rate: z.number().finite().min(0).max(100000),
  markup_fraction: share,
  tax_fraction: share,
  currency: z.string().trim().min(1).max(8),
});
const acceptBody = z.object({ option: z.string().uuid().nullable().default(null), total: z.number().finite() });

/** General cautions every export carries (DESIGN.md "Safety"). */
export const CAUTIONS = [
  'Pressure: the lowest pipes see the full static head when lines are shut; keep working pressure within the pipe class (72 % of the rating without a surge analysis, ASAE S376.1).',
  'Trenches: follow local trench-safety rules; call before you dig for buried services.',
  'Drinking water: keep stock and irrigation lines from back-flowing into the house supply (backflow prevention per local code).',
  'Frost: bury year-round lines below local frost depth or drain them before winter.',
  'Tanks: full tanks are heavy; stands and pads need a proper foundation.',
];

async function designOf(db: DbOrTx, project: ProjectRow, option: unknown) {
  const network = await loadNetwork(db, project.id);
  if (typeof option === 'string' && option !== '') {
    if (!isUuid(option)) throw new ApiError('not-found', 'No such option');
    const [row] = await db
      .select()
      .from(designOptions)
      .where(and(eq(designOptions.id, option), eq(designOptions.projectId, project.id)));
    if (!row) throw new ApiError('not-found', 'No such option');
    return { kind: 'option' as const, optionId: row.id, name: row.name, version: network.version, document: row.document as NetworkDocument };
  }
  return { kind: 'current' as const, optionId: null, name: 'Current design', version: network.version, document: network.document as NetworkDocument };
}

async function acceptances(db: DbOrTx, projectId: string) {
  const rows = await db
    .select({ a: estimateAcceptances, name: users.name, optionName: designOptions.name })
    .from(estimateAcceptances)
    .leftJoin(users, eq(users.id, estimateAcceptances.acceptedBy))
    .leftJoin(designOptions, eq(designOptions.id, estimateAcceptances.optionId))
    .where(eq(estimateAcceptances.projectId, projectId))
    .orderBy(desc(estimateAcceptances.acceptedAt));
  return rows.map(({ a, name, optionName }) => ({
    id: a.id,
    networkVersion: a.networkVersion,
    optionId: a.optionId,
    design: optionName ?? 'Current design',
    total: a.total,
    currency: a.currency,
    acceptedAt: a.acceptedAt.toISOString(),
    acceptedBy: name ?? null,
  }));
}

export function takeoffRoutes(api: ApiRoutes, ctx: AppContext): void {
  const { db } = ctx;

  const priced = async (project: ProjectRow, option: unknown) => {
    const design = await designOf(db, project, option);
    if (design.document.nodes.length === 0) throw new ApiError('conflict', 'Nothing to take off yet: draw and save a network first');
    const inputs = await designInputs(db, project.teamId, project.id);
    return { design, inputs, evaluation: evaluateDesign(design.document, inputs) };
  };

  api.get('/projects/:id/takeoff', 'takeoff.read', async (req, res) => {
    const project = projectOf(req);
    const { design, inputs, evaluation } = await priced(project, req.query.option);
    res.json({
      design: { kind: design.kind, optionId: design.optionId, name: design.name, version: design.version },
      takeoff: evaluation.takeoff,
      estimate: evaluation.estimate,
      summary: evaluation.summary,
      settings: inputs.settings,
      acceptances: await acceptances(db, project.id),
      cautions: CAUTIONS,
      note: CODES_NOTE,
    });
  });

  api.put('/projects/:id/takeoff/settings', 'takeoff.write', async (req, res) => {
    const project = projectOf(req);
    const body = parseBody(settingsBody, req.body);
    body.other.forEach((o, i) => {
      if ((o.quantity === undefined) === (o.per_pipe_m === undefined))
        throw new ApiError('validation', `other.${i}: give either quantity or per_pipe_m`, {
          fields: [{ path: `other.${i}.quantity`, message: 'give either quantity or per_pipe_m' }],
        });
    });
    await db.transaction(async (tx) => {
      await tx
        .insert(takeoffSettings)
        .values({ projectId: project.id, settings: body, updatedBy: req.user!.id })
        .onConflictDoUpdate({ target: takeoffSettings.projectId, set: { settings: body, updatedAt: new Date(), updatedBy: req.user!.id } });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'takeoff.settings',
        target: project.name,
        detail: { waste: body.waste_fraction, markup: body.markup_fraction, tax: body.tax_fraction },
      });
    });
    res.json(body);
  });

  api.post('/projects/:id/estimate/accept', 'estimate.accept', async (req, res) => {
    const project = projectOf(req);
    const body = parseBody(acceptBody, req.body);
    const { design, inputs, evaluation } = await priced(project, body.option ?? undefined);
    if (Math.abs(evaluation.estimate.total - body.total) > 0.005) {
      throw new ApiError(
        'conflict',
        `The estimate changed since you opened it: it is now ${evaluation.estimate.total.toFixed(2)} ${inputs.settings.currency}, not ${body.total.toFixed(2)}. Look at it again before accepting.`,
      );
    }
    const [row] = await db.transaction(async (tx) => {
      const r = await tx
        .insert(estimateAcceptances)
        .values({
          projectId: project.id,
          networkVersion: design.version,
          optionId: design.optionId,
          total: evaluation.estimate.total,
          currency: inputs.settings.currency,
          estimate: evaluation.estimate,
          acceptedBy: req.user!.id,
        })
        .returning({ id: estimateAcceptances.id, at: estimateAcceptances.acceptedAt });
      await audit(tx, {
        teamId: project.teamId,
        user: req.user!,
        action: 'estimate.accept',
        target: `${project.name} / ${design.name}`,
        detail: { total: evaluation.estimate.total, version: design.version },
      });
      return r;
    });
    res
      .status(201)
      .json({ id: row.id, acceptedAt: row.at.toISOString(), total: evaluation.estimate.total, design: design.name, networkVersion: design.version });
  });

  api.get('/projects/:id/takeoff.csv', 'takeoff.read', async (req, res) => {
    const project = projectOf(req);
    const { design, inputs, evaluation } = await priced(project, req.query.option);
    // the project's units, as the screen and the workbook: lengths sold by the metre are sold by the foot in US files
    const u = sheetUnits(project.units);
    const L = u.label('length');
    const length = (si: number | undefined) => (si === undefined ? '' : u.v('length', si));
    const csv = Papa.unparse({
      fields: [
        'code',
        'description',
        'group',
        'quantity',
        'unit',
        `network_length_${L}`,
        `with_waste_${L}`,
        'pieces',
        `piece_length_${L}`,
        'unit_price',
        'amount',
        'currency',
        'elements',
      ],
      data: evaluation.takeoff.rows.map((r, i) => {
        const sold = soldUnit(r.unit, u.system);
        const price = evaluation.estimate.lines[i].unit_price;
        return [
          r.code,
          r.description,
          r.group,
          r.quantity * sold.perSi,
          sold.unit,
          length(r.network_m),
          length(r.with_waste_m),
          r.pieces ?? '',
          length(r.piece_m),
          price === null ? '' : price / sold.perSi,
          evaluation.estimate.lines[i].amount,
          inputs.settings.currency,
          r.elements.join(' '),
        ];
      }),
    });
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', inlineDisposition(`${project.name} - ${design.name} - takeoff.csv`).replace(/^inline/, 'attachment'));
    res.send(csv);
  });

  api.get('/projects/:id/export.xlsx', 'takeoff.read', async (req, res) => {
    const project = projectOf(req);
    const { design, inputs, evaluation } = await priced(project, req.query.option);
    const [state] = await db
      .select({ status: networkVersions.status })
      .from(networkVersions)
      .where(and(eq(networkVersions.projectId, project.id), eq(networkVersions.version, design.version)));
    const hasTanks = design.document.nodes.some((n) => n.kind === 'tank');
    let timeline = null;
    if (hasTanks) {
      try {
        timeline = simulate(design.document, { duration_s: 24 * 3600, step_s: 900 });
      } catch {
        timeline = null;
      }
    }
    const optionRows = await db.select().from(designOptions).where(eq(designOptions.projectId, project.id));
    const network = await loadNetwork(db, project.id);
    const options = [
      {
        name: 'Current design',
        preferred: false,
        summary: (network.document as NetworkDocument).nodes.length ? evaluateDesign(network.document as NetworkDocument, inputs).summary : null,
      },
      ...optionRows.map((o) => ({ name: o.name, preferred: o.preferred, summary: evaluateDesign(o.document as NetworkDocument, inputs).summary })),
    ];
    const failures = evaluation.summary;
    const cautions = [...CAUTIONS];
    if (failures.failingChecks === null) cautions.unshift('The review checks could not be run for this design: see the Review tab before building.');
    else if (failures.failingChecks > 0)
      cautions.unshift(
        `${failures.failingChecks} review check${failures.failingChecks === 1 ? '' : 's'} fail for this design: see the Review tab before building.`,
      );
    if (evaluation.estimate.missing.length > 0)
      cautions.unshift(
        `${evaluation.estimate.missing.length} takeoff row${evaluation.estimate.missing.length === 1 ? ' has' : 's have'} no price: ${evaluation.estimate.missing.join(', ')}.`,
      );
    const buffer = await buildWorkbook({
      project: project.name,
      site: project.siteName,
      design: design.name,
      version: design.version,
      reviewState: state?.status ?? 'not reviewed',
      currency: inputs.settings.currency,
      units: project.units,
      document: design.document,
      steady: evaluation.steady,
      takeoff: evaluation.takeoff,
      estimate: evaluation.estimate,
      timeline,
      options,
      cautions,
      generatedAt: new Date(),
    });
    res.setHeader('Content-Type', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    res.setHeader('Content-Disposition', inlineDisposition(`${project.name} - ${design.name}.xlsx`).replace(/^inline/, 'attachment'));
    res.send(buffer);
  });
}
