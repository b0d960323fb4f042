/** The review: checklist, rules with sources, surge physics, version comparison and failure what-ifs. */
export * from './types';
export { RULES, type Rule, type RuleId } from './rules';
export { reviewChecklist, failingCheckCount, type ChecklistOptions } from './checklist';
export { supplyFromBudget, type SupplyInputs } from './supply-checks';
export { kortewegWaveSpeed, pipeWaveSpeed } from './wave-speed';
export { joukowskyHead, michaudHead } from './joukowsky';
export { diffVersions, summariseDiff, compareOutlets, type VersionDiff, type OutletComparison } from './version-diff';
export { whatIfs, type WhatIfTable, type WhatIfResult, type WhatIfScenario, type OutletHit, type WhatIfKind } from './what-ifs';
