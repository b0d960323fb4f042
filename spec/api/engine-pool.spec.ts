import { expect } from 'chai';
import { eq } from 'drizzle-orm';
import { networks, users } from '../../drizzle/schema';
import { solve } from '../../engine';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { EngineTimeout, runEngine } from '../../server/engine-pool/pool';
import { saveNetwork } from '../../server/network/network-store';
import { loopedGrid } from '../../bench/looped-grid';
import { insertProject, SMALL_NETWORK } from './fixtures';
import { startTestApp, type TestApp } from './test-app';

describe('engine pool (server/engine-pool): engine work off the request thread, with a time limit', () => {
  it('a task in the pool answers exactly what the engine answers in this thread', async () => {
    expect(await runEngine('solve', [hillSmallholding])).to.deep.equal(solve(hillSmallholding));
    const checked = await runEngine('checkAndSolve', [{ ...SMALL_NETWORK, links: [{ ...SMALL_NETWORK.links[0], diameter_m: 0 }] }]);
    expect(checked).to.deep.equal({
      ok: false,
      problems: [{ path: ['links', 0, 'diameter_m'], element: 'P1', message: 'P1.diameter_m: must be a positive number (got 0)' }],
    });
  });

  it('the request thread keeps running while a 10,000-tee network solves in the pool', async () => {
    const grid = loopedGrid(40, 250);
    let ticks = 0;
    let done = false;
    const tick = (): void => {
      if (!done) {
        ticks++;
        setImmediate(tick);
      }
    };
    setImmediate(tick);
    const result = await runEngine('solve', [grid]);
    done = true;
    expect(result.converged).to.equal(true);
    // Run in this thread, the solve would have held the event loop for its whole length: no tick.
    expect(ticks).to.be.greaterThan(10);
  });

  it('a task past its time limit is stopped (EngineTimeout) and the pool goes on answering', async () => {
    const error = await runEngine('simulate', [hillSmallholding, { duration_s: 30 * 86400, step_s: 60 }], { timeout_ms: 50 }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).to.be.instanceOf(EngineTimeout);
    expect((error as Error).message).to.equal('engine task "simulate" stopped after 50 ms');
    expect((await runEngine('solve', [SMALL_NETWORK])).converged).to.equal(true);
  });

  describe('the save-time solve', () => {
    let t: TestApp;
    before(async () => {
      t = await startTestApp();
    });
    after(async () => {
      await t.close();
    });

    it('a save whose solve runs past the limit is still stored, with a result saying the solve was stopped', async () => {
      const id = await insertProject(t.db, t.seeded!.demoTeamId);
      const [user] = await t.db.select({ id: users.id, email: users.email }).from(users).where(eq(users.email, 'designer@runnel.test'));
      const saved = await saveNetwork(t.db, {
        projectId: id,
        teamId: t.seeded!.demoTeamId,
        user,
        expectedVersion: 0,
        document: loopedGrid(40, 250),
        solveTimeout_ms: 1,
      });
      expect(saved.version).to.equal(1);
      const [row] = await t.db.select({ results: networks.results }).from(networks).where(eq(networks.projectId, id));
      expect(row.results).to.deep.equal({
        converged: false,
        iterations: 0,
        nodes: {},
        links: {},
        warnings: [{ code: 'not-converged', element: null, message: 'network: the server stopped the solve after 0.001 s' }],
      });
    });
  });
});
