/**
 * Demo data on first start (idempotent: skipped when the demo admin exists). All invented:
 * the "Ridgeback Water Co-op" team with one user per role and the "Hillside smallholding"
 * project, plus a second team ("Cold Creek Growers") so cross-team isolation can be shown.
 */
import { and, asc, eq } from 'drizzle-orm';
import { applyBudget, planBudget } from '../engine/budget';
import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { hillSmallholdingBudget } from '../engine/examples/hill-smallholding-budget';
import { memberships, projects, teams, users } from '../drizzle/schema';
import { audit } from './audit';
import type { Db } from './db';
import { hashPassword } from './auth/passwords';
import { saveBudget } from './budget/budget-store';
import { saveNetwork } from './network/network-store';
import { markSubmitted } from './review/signoff';
import { seedPricesAndOptions } from './options/seed-options';
import type { Role } from './permissions';
import { seedDemoWalk } from './walk/demo-walk';

export const DEMO_PASSWORD = 'runnel-demo-2026';
export const DEMO_TEAM = 'Ridgeback Water Co-op';
export const DEMO_PROJECT = 'Hillside smallholding';
export const OTHER_TEAM = 'Cold Creek Growers';
export const OTHER_PROJECT = 'Lower paddock troughs';

/** One demo user per role in the demo team. */
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@runnel.test', name: 'Alex Admin', role: 'admin' },
  { email: 'designer@runnel.test', name: 'Dana Designer', role: 'designer' },
  { email: 'reviewer@runnel.test', name: 'Riley Reviewer', role: 'reviewer' },
  { email: 'estimator@runnel.test', name: 'Eli Estimator', role: 'estimator' },
  { email: 'owner@runnel.test', name: 'Morgan Owner', role: 'owner' },
];
/** The only member (admin and designer) of the second team. */
export const OTHER_USER = { email: 'other@runnel.test', name: 'Sam Other' };

export interface SeedResult {
  seeded: boolean;
  demoTeamId: string;
  demoProjectId: string;
  otherTeamId: string;
  otherProjectId: string;
}

export async function seed(db: Db, { bcryptCost }: { bcryptCost: number }): Promise<SeedResult> {
  const [existing] = await db.select({ id: users.id }).from(users).where(eq(users.email, DEMO_USERS[0].email));
  if (existing) return { seeded: false, ...(await findSeeded(db)) };

  const passwordHash = await hashPassword(DEMO_PASSWORD, bcryptCost);
  const ids = await db.transaction(async (tx) => {
    const [team] = await tx.insert(teams).values({ name: DEMO_TEAM }).returning({ id: teams.id });
    const created = await tx
      .insert(users)
      .values(DEMO_USERS.map((u) => ({ email: u.email, name: u.name, passwordHash })))
      .returning({ id: users.id, email: users.email });
    await tx.insert(memberships).values(
      created.map((u) => ({
        teamId: team.id,
        userId: u.id,
        roles: [DEMO_USERS.find((d) => d.email === u.email)!.role],
      })),
    );
    const [project] = await tx
      .insert(projects)
      .values({
        teamId: team.id,
        name: DEMO_PROJECT,
        siteName: 'Ridgeback hill block',
        units: 'si',
        notes: 'Invented demo: a spring-fed smallholding with storage on the ridge and gravity lines to garden, orchard, house and troughs.',
      })
      .returning({ id: projects.id });
    await audit(tx, { teamId: team.id, user: null, action: 'seed', target: DEMO_TEAM });

    const [otherTeam] = await tx.insert(teams).values({ name: OTHER_TEAM }).returning({ id: teams.id });
    const [other] = await tx
      .insert(users)
      .values({ ...OTHER_USER, passwordHash })
      .returning({ id: users.id });
    await tx.insert(memberships).values({ teamId: otherTeam.id, userId: other.id, roles: ['admin', 'designer'] });
    const [otherProject] = await tx
      .insert(projects)
      .values({ teamId: otherTeam.id, name: OTHER_PROJECT, siteName: 'Cold Creek flats' })
      .returning({ id: projects.id });
    const designer = created.find((u) => u.email === 'designer@runnel.test')!;
    return { demoTeamId: team.id, demoProjectId: project.id, otherTeamId: otherTeam.id, otherProjectId: otherProject.id, designer };
  });
  // The demo network goes through the same save path as the API, so its results are computed; its
  // outlets already carry the demo budget's design flows, so saving the budget then changes nothing.
  await saveNetwork(db, {
    projectId: ids.demoProjectId,
    teamId: ids.demoTeamId,
    user: ids.designer,
    expectedVersion: 0,
    document: applyBudget(hillSmallholding, planBudget(hillSmallholdingBudget, hillSmallholding)),
  });
  await saveBudget(db, {
    projectId: ids.demoProjectId,
    projectName: DEMO_PROJECT,
    teamId: ids.demoTeamId,
    user: ids.designer,
    expectedVersion: 0,
    document: hillSmallholdingBudget,
  });
  // Version 1 waits for review, so the reviewer has something to approve or return.
  await markSubmitted(db, {
    projectId: ids.demoProjectId,
    teamId: ids.demoTeamId,
    version: 1,
    user: ids.designer,
    note: 'First full layout: tanks on the ridge, gravity main, orchard PRV and four troughs. Please check the south trough line across the dip.',
  });
  await seedPricesAndOptions(db, { teamId: ids.demoTeamId, projectId: ids.demoProjectId, userId: ids.designer.id });
  await db.transaction((tx) => seedDemoWalk(tx, { id: ids.demoProjectId, teamId: ids.demoTeamId, name: DEMO_PROJECT }, ids.designer));
  return { seeded: true, demoTeamId: ids.demoTeamId, demoProjectId: ids.demoProjectId, otherTeamId: ids.otherTeamId, otherProjectId: ids.otherProjectId };
}

async function findSeeded(db: Db): Promise<Omit<SeedResult, 'seeded'>> {
  const demo = await findTeamProject(db, DEMO_TEAM, DEMO_PROJECT);
  const other = await findTeamProject(db, OTHER_TEAM, OTHER_PROJECT);
  return { demoTeamId: demo.teamId, demoProjectId: demo.projectId, otherTeamId: other.teamId, otherProjectId: other.projectId };
}

/** The seeded team and its project, oldest first; a user's team or project of the same name elsewhere is not taken. */
async function findTeamProject(db: Db, teamName: string, projectName: string): Promise<{ teamId: string; projectId: string }> {
  const [row] = await db
    .select({ teamId: teams.id, projectId: projects.id })
    .from(teams)
    .leftJoin(projects, and(eq(projects.teamId, teams.id), eq(projects.name, projectName)))
    .where(eq(teams.name, teamName))
    .orderBy(asc(teams.createdAt), asc(projects.createdAt))
    .limit(1);
  return { teamId: row?.teamId ?? '', projectId: row?.projectId ?? '' };
}
