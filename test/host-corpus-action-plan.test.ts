import { strict as assert } from 'node:assert';
import { planCorpusActions } from '../extension/src/host/pure/corpus-action-plan';

// The titles are the editor contract the e2e tests click on (task brief; common practice, no source).
describe('planCorpusActions', () => {
  const suggestions = ['via', 'submitted', 'thanks'];

  it('planCorpusActions offers one fix per distinct flagged term, then "add all"', () => {
    assert.deepEqual(planCorpusActions(['via', 'via', 'thanks'], suggestions, new Set()), [
      { kind: 'addOne', title: "Add 'via' to stop list", term: 'via' },
      { kind: 'addOne', title: "Add 'thanks' to stop list", term: 'thanks' },
      { kind: 'addAll', title: 'Add all 3 suggested terms', terms: ['via', 'submitted', 'thanks'] },
    ]);
  });

  it('planCorpusActions leaves out terms already added and counts only the open ones', () => {
    assert.deepEqual(planCorpusActions(['via', 'submitted'], suggestions, new Set(['via'])), [
      { kind: 'addOne', title: "Add 'submitted' to stop list", term: 'submitted' },
      { kind: 'addAll', title: 'Add all 2 suggested terms', terms: ['submitted', 'thanks'] },
    ]);
  });

  it('planCorpusActions offers nothing where no flagged term is in range', () => {
    assert.deepEqual(planCorpusActions(['boiler'], suggestions, new Set()), []);
    assert.deepEqual(planCorpusActions([], suggestions, new Set()), []);
  });

  it('planCorpusActions drops "add all" when a single suggestion is left', () => {
    assert.deepEqual(planCorpusActions(['thanks'], suggestions, new Set(['via', 'submitted'])), [
      { kind: 'addOne', title: "Add 'thanks' to stop list", term: 'thanks' },
    ]);
  });

  it('planCorpusActions bounds the single-term fixes', () => {
    const many = Array.from({ length: 12 }, (_, i) => `t${i}`);
    const actions = planCorpusActions(many, many, new Set(), 4);
    assert.equal(actions.filter((a) => a.kind === 'addOne').length, 4);
    assert.equal(actions[actions.length - 1]!.title, 'Add all 12 suggested terms');
  });
});
