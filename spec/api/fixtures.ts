/** Rows inserted straight into the test database, so a test can act on a fresh target. */
import { randomBytes, randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { files, invitations, memberships, projects, reviewComments, teams, users } from '../../drizzle/schema';
import type { Db } from '../../server/db';
import type { Role } from '../../server/permissions';
import { hashToken } from '../../server/auth/invitation-token';
import { saveNetwork } from '../../server/network/network-store';
import { markSubmitted } from '../../server/review/signoff';
import type { NetworkDocument } from '../../engine';

/** The smallest PNG signature plus an IHDR start: enough for the magic-byte check. */
export const PNG_BYTES = Buffer.concat([
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
  Buffer.from('0000000dIHDR', 'latin1'),
  Buffer.alloc(32),
]);
export const JPEG_BYTES = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(64)]);
export const SURVEY_CSV = 'label,easting,northing,elevation\nSpring,0,0,12.5\nTank site,40,310,41\n';

/** A tank feeding one outlet through 120 m of pipe: small, valid, solvable. */
export const SMALL_NETWORK: NetworkDocument = {
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  nodes: [
    { id: 'T1', kind: 'tank', elevation_m: 41, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5 },
    { id: 'O1', kind: 'outlet', elevation_m: 18, demand_m3s: 0.0003, min_pressure_m: 7 },
  ],
  links: [{ id: 'P1', kind: 'pipe', from: 'T1', to: 'O1', length_m: 120, diameter_m: 0.0266, roughness: 150 }],
};

export async function insertProject(db: Db, teamId: string, name = `Fixture ${randomUUID().slice(0, 8)}`): Promise<string> {
  const [row] = await db.insert(projects).values({ teamId, name }).returning({ id: projects.id });
  return row.id;
}

export async function insertMember(db: Db, teamId: string, roles: Role[]): Promise<string> {
  const [user] = await db
    .insert(users)
    .values({ email: `m-${randomUUID()}@example.test`, name: 'Fixture Member', passwordHash: 'x' })
    .returning({ id: users.id });
  await db.insert(memberships).values({ teamId, userId: user.id, roles });
  return user.id;
}

export async function insertTeam(db: Db, name = `Fixture team ${randomUUID().slice(0, 8)}`): Promise<string> {
  const [team] = await db.insert(teams).values({ name }).returning({ id: teams.id });
  return team.id;
}

/** An open invitation; returns the token (only its hash is stored). */
export async function insertInvitation(db: Db, teamId: string, roles: Role[], email = `i-${randomUUID()}@example.test`): Promise<string> {
  return (await insertInvitationRow(db, teamId, roles, email)).token;
}

/** An open invitation; returns its id and token. */
export async function insertInvitationRow(db: Db, teamId: string, roles: Role[], email = `i-${randomUUID()}@example.test`) {
  const token = randomBytes(24).toString('base64url');
  const [row] = await db
    .insert(invitations)
    .values({ teamId, email, roles, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + 86400_000) })
    .returning({ id: invitations.id });
  return { id: row.id, token };
}

export async function insertFile(db: Db, projectId: string): Promise<string> {
  const [row] = await db
    .insert(files)
    .values({
      projectId,
      kind: 'backdrop',
      filename: 'site.png',
      mime: 'image/png',
      size: PNG_BYTES.length,
      bytes: PNG_BYTES,
    })
    .returning({ id: files.id });
  return row.id;
}

export async function insertSurveyFile(db: Db, projectId: string): Promise<string> {
  const bytes = Buffer.from(SURVEY_CSV);
  const [row] = await db
    .insert(files)
    .values({ projectId, kind: 'survey', filename: 'pegs.csv', mime: 'text/csv', size: bytes.length, bytes })
    .returning({ id: files.id });
  return row.id;
}

/** The demo user holding `role` (id and e-mail), for saving through the store as that user. */
export async function demoUserRow(db: Db, role: Role): Promise<{ id: string; email: string }> {
  const [row] = await db
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(eq(users.email, `${role}@runnel.test`));
  return row;
}

/** A fresh project with `document` saved once through the real save path (version 1 kept). */
export async function insertSavedProject(db: Db, teamId: string, document: NetworkDocument = SMALL_NETWORK): Promise<string> {
  const id = await insertProject(db, teamId);
  await saveNetwork(db, { projectId: id, teamId, user: await demoUserRow(db, 'designer'), expectedVersion: 0, document });
  return id;
}

/** A fresh saved project whose version 1 is submitted by the demo designer. */
export async function insertSubmittedProject(db: Db, teamId: string): Promise<string> {
  const id = await insertSavedProject(db, teamId);
  await markSubmitted(db, { projectId: id, teamId, version: 1, user: await demoUserRow(db, 'designer'), note: 'fixture' });
  return id;
}

/** An open review thread on version 1 of a project, pinned to its first node. */
export async function insertComment(db: Db, projectId: string): Promise<string> {
  const [row] = await db
    .insert(reviewComments)
    .values({ projectId, version: 1, element: null, xM: 0, yM: 0, body: 'fixture comment' })
    .returning({ id: reviewComments.id });
  return row.id;
}
