/** Debounced latest-wins solving for the Layout editor's live results. */
import { expect } from 'chai';
import { SolveScheduler } from '../../client/src/app/screens/layout/editor/solve-scheduler';
import { ManualTimers } from './manual-timers';

describe('Layout editor: solve scheduling', () => {
  it('debounces bursts of edits into one solve of the latest document', () => {
    const t = new ManualTimers();
    const sent: [string, number][] = [];
    const s = new SolveScheduler<string>((job, seq) => sent.push([job, seq]), t, 60);
    s.request('a');
    t.advance(30);
    s.request('b');
    t.advance(59);
    expect(sent).to.have.length(0);
    t.advance(1);
    expect(sent).to.deep.equal([['b', 1]]);
  });

  it('while the worker is busy keeps only the newest job and sends it when the worker answers', () => {
    const t = new ManualTimers();
    const sent: string[] = [];
    const s = new SolveScheduler<string>((job) => sent.push(job), t, 60);
    s.request('a');
    t.advance(60);
    s.request('b');
    t.advance(60);
    s.request('c');
    t.advance(60);
    expect(sent).to.deep.equal(['a']);
    expect(s.finished(1)).to.equal(false);
    expect(sent).to.deep.equal(['a', 'c']);
    expect(s.finished(2)).to.equal(true);
    expect(s.idle).to.equal(true);
  });

  it('a request with no delay (a properties-panel edit) is sent at once when the worker is idle, and waits as the pending job when busy', () => {
    const t = new ManualTimers();
    const sent: string[] = [];
    const s = new SolveScheduler<string>((job) => sent.push(job), t, 60);
    s.request('drag');
    s.request('typed', 0);
    expect(sent).to.deep.equal(['typed']);
    expect(t.pending, 'the drag debounce was cancelled').to.equal(0);
    s.request('typed again', 0);
    expect(sent).to.deep.equal(['typed']);
    s.finished(1);
    expect(sent).to.deep.equal(['typed', 'typed again']);
  });
});
