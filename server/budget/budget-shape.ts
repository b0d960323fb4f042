/**
 * The shape check of an incoming water budget (zod), before the engine's validateBudget: the body
 * envelope, the top-level fields and each use's identifying fields. Messages name the row
 * (`uses[2] "Ewes".count: …`) so a 400 tells the user what to fix.
 */
import { z } from 'zod';
import { validateBudget } from '../../engine/budget';
import type { FieldError } from '../errors';
import { issuePath } from '../errors';

const num = z.number({ error: 'must be a number' }).finite('must be a finite number');
const text = z.string({ error: 'must be a string' }).max(200);

const useShape = z.looseObject({
  id: z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(100),
  name: text,
  kind: z.enum(['livestock', 'garden', 'tunnel', 'orchard', 'household', 'other'], { error: 'must be livestock, garden, tunnel, orchard, household or other' }),
  months: z.array(num, { error: 'must be a list of months 1–12' }).max(12),
  outlets: z.array(z.string({ error: 'must be an outlet id' }).max(100), { error: 'must be a list of outlet ids' }).max(200),
  count: num.optional(),
  area_m2: num.optional(),
  window_h: num.optional(),
  notes: z.string().max(2000).optional(),
});

export const budgetShape = z.looseObject({
  schema: z.literal('runnel.budget/1', { error: 'must be "runnel.budget/1"' }),
  uses: z.array(useShape, { error: 'must be a list of water uses' }).max(500),
  peak_factor: num,
  peak_sun_hours: z.array(num, { error: 'must be 12 numbers' }).length(12, 'must be 12 numbers (January first)'),
});

/** The body of PUT /api/projects/:id/budget. */
export const saveBudgetBody = z.object({
  version: z.number({ error: 'must be a number' }).int('must be an integer').min(0, 'must be 0 or more'),
  document: z.unknown(),
  /** Outlets whose Layout-edited flow the designer chose to replace with the budget's (engine/budget/layout-differences). */
  apply_outlets: z
    .array(z.string({ error: 'must be an outlet id' }).max(100), { error: 'must be a list of outlet ids' })
    .max(500)
    .optional(),
});

/** Field errors for a budget ([] when it can be planned): zod shape first, then the engine's rules. */
export function budgetErrors(doc: unknown): FieldError[] {
  const parsed = budgetShape.safeParse(doc);
  if (!parsed.success) {
    return parsed.error.issues.map((issue) => {
      const [list, index, ...rest] = issue.path;
      const path = issuePath(['document', ...issue.path]);
      if (list === 'uses' && typeof index === 'number') {
        const name = useName(doc, index);
        return { path, message: `uses[${index}]${name ? ` "${name}"` : ''}${rest.length ? `.${issuePath(rest)}` : ''}: ${issue.message}` };
      }
      return { path, message: `${issuePath(issue.path) || 'budget'}: ${issue.message}` };
    });
  }
  return validateBudget(doc).map((message) => ({ path: `document.${message.split(':')[0].replace(/ ".*"/, '')}`, message }));
}

function useName(doc: unknown, index: number): string | undefined {
  const uses = (doc as { uses?: unknown } | null)?.uses;
  const use: unknown = Array.isArray(uses) ? uses[index] : undefined;
  return use && typeof use === 'object' && 'name' in use && typeof use.name === 'string' && use.name.trim() ? use.name : undefined;
}
