import type { BudgetDocument } from '../budget/budget-document';

/**
 * The demo farm's water budget (invented; no real farm or person): a ewe flock on the west
 * paddocks, a small suckler herd on the east and south paddocks through the grazing season, the
 * kitchen garden and a high tunnel off the garden bib, the cider orchard's two drip blocks (young
 * trees and a few old standards), the farmhouse and the lambing shed in spring. Windows follow the
 * network's hourly patterns (stock 4 h, garden 1.5 h, orchard drip 3 h), so the Timeline delivers
 * what the budget asks. Peak-sun hours are an invented mid-latitude hill site.
 *
 * @example
 * planBudget(hillSmallholdingBudget, hillSmallholding).verdicts?.[6].status
 */

const SPRING_TO_AUTUMN = [4, 5, 6, 7, 8, 9, 10];
const ALL = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];

export const hillSmallholdingBudget: BudgetDocument = {
  schema: 'runnel.budget/1',
  peak_factor: 3,
  hot_months: [6, 7, 8],
  peak_sun_hours: [1.9, 2.7, 3.7, 4.7, 5.4, 5.9, 6.1, 5.4, 4.4, 3.2, 2.1, 1.6],
  uses: [
    { id: 'ewes', name: 'Ewe flock (west paddocks)', kind: 'livestock', rate_key: 'sheep', count: 120, months: ALL, outlets: ['TR1', 'TR2'], window_h: 4 },
    {
      id: 'herd',
      name: 'Suckler herd (east and south paddocks)',
      kind: 'livestock',
      rate_key: 'beef-cow-calf',
      count: 10,
      months: SPRING_TO_AUTUMN,
      outlets: ['TR3', 'TR4'],
      window_h: 4,
    },
    {
      id: 'garden',
      name: 'Kitchen garden beds',
      kind: 'garden',
      rate_key: 'garden',
      area_m2: 120,
      months: [4, 5, 6, 7, 8, 9],
      outlets: ['GARDEN'],
      window_h: 1.5,
    },
    {
      id: 'tunnel',
      name: 'High tunnel (tomatoes, peppers)',
      kind: 'tunnel',
      rate_key: 'high-tunnel',
      area_m2: 90,
      months: [3, 4, 5, 6, 7, 8, 9, 10],
      outlets: ['GARDEN'],
      window_h: 1.5,
    },
    {
      id: 'orchard-young',
      name: 'Cider orchard, young trees',
      kind: 'orchard',
      rate_key: 'fruit-young',
      count: 60,
      months: [5, 6, 7, 8, 9],
      outlets: ['ORCH-N'],
      window_h: 3,
    },
    {
      id: 'orchard-old',
      name: 'Cider orchard, old standards',
      kind: 'orchard',
      rate_key: 'apple-mature',
      count: 8,
      months: [5, 6, 7, 8, 9],
      outlets: ['ORCH-S'],
      window_h: 3,
    },
    { id: 'house', name: 'Farmhouse (3 people)', kind: 'household', rate_key: 'household', count: 3, months: ALL, outlets: ['HOUSE'], window_h: 2.2 },
    { id: 'shed', name: 'Lambing shed (wash-down, pens)', kind: 'other', daily_m3: 0.25, months: [2, 3, 4], outlets: ['SHED'], window_h: 3 },
  ],
  rates: {},
  manual_outlets: ['HYD'],
  fill_pump: 'PU1',
  tanks: ['T1', 'T2'],
  waste_allowance: 0.1,
};
