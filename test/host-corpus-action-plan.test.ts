import { strict as assert } from 'node:assert';
import { planCorpusActions, stopTitle } from '../extension/src/host/pure/corpus-action-plan';

// The titles are the editor contract the e2e tests click on, and they carry the Report's own
// figures (issue 10: "Stop 'the' — 30% of all-pair similarity, lift 0.24"); common practice, no source.
describe('planCorpusActions', () => {
  const suggestions = ['via', 'submitted', 'thanks'];
  const evidence = new Map([
    ['via', { pullShare: 0.301, neighborLift: 0.244 }],
    ['submitted', { pullShare: 0.042, neighborLift: null }],
    ['thanks', { pullShare: 0.0031, neighborLift: 1.5 }],
  ]);

  it('planCorpusActions offers one fix per distinct flagged term with its evidence, then "stop all"', () => {
    assert.deepEqual(planCorpusActions(['via', 'via', 'thanks'], suggestions, new Set(), evidence), [
      { kind: 'addOne', title: "Stop 'via' — 30% of all-pair similarity, lift 0.24", term: 'via' },
      { kind: 'addOne', title: "Stop 'thanks' — 0.31% of all-pair similarity, lift 1.50", term: 'thanks' },
      { kind: 'addAll', title: 'Stop all 3 suggested terms — 35% of all-pair similarity together', terms: ['via', 'submitted', 'thanks'] },
    ]);
  });

  it('planCorpusActions leaves out terms already added and counts only the open ones', () => {
    assert.deepEqual(planCorpusActions(['via', 'submitted'], suggestions, new Set(['via']), evidence), [
      { kind: 'addOne', title: "Stop 'submitted' — 4.2% of all-pair similarity", term: 'submitted' },
      { kind: 'addAll', title: 'Stop all 2 suggested terms — 4.5% of all-pair similarity together', terms: ['submitted', 'thanks'] },
    ]);
  });

  it('planCorpusActions offers nothing where no flagged term is in range', () => {
    assert.deepEqual(planCorpusActions(['boiler'], suggestions, new Set(), evidence), []);
    assert.deepEqual(planCorpusActions([], suggestions, new Set(), evidence), []);
  });

  it('planCorpusActions drops "stop all" when a single suggestion is left', () => {
    assert.deepEqual(planCorpusActions(['thanks'], suggestions, new Set(['via', 'submitted']), evidence), [
      { kind: 'addOne', title: "Stop 'thanks' — 0.31% of all-pair similarity, lift 1.50", term: 'thanks' },
    ]);
  });

  it('planCorpusActions bounds the single-term fixes and titles without evidence plainly', () => {
    const many = Array.from({ length: 12 }, (_, i) => `t${i}`);
    const actions = planCorpusActions(many, many, new Set(), new Map(), { maxSingle: 4 });
    assert.equal(actions.filter((a) => a.kind === 'addOne').length, 4);
    assert.equal(actions[0]!.title, "Stop 't0'");
    assert.equal(actions[actions.length - 1]!.title, 'Stop all 12 suggested terms');
  });

  it('planCorpusActions carries the verdict\'s caution on "stop all" only', () => {
    const caution = 'the review judged this list to lower neighbour standout (\u22120.03)';
    const actions = planCorpusActions(['via'], suggestions, new Set(), evidence, { caution });
    assert.equal(actions[0]!.title, "Stop 'via' — 30% of all-pair similarity, lift 0.24");
    assert.equal(actions[1]!.title, `Stop all 3 suggested terms — 35% of all-pair similarity together (${caution})`);
  });

  it('stopTitle writes the share with digits that fit its size', () => {
    assert.equal(stopTitle('a', { pullShare: 0.12345, neighborLift: null }), "Stop 'a' — 12% of all-pair similarity");
    assert.equal(stopTitle('a', { pullShare: 0.012345, neighborLift: 0.5 }), "Stop 'a' — 1.2% of all-pair similarity, lift 0.50");
  });
});
