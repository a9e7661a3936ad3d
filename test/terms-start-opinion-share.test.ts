// startOpinionShare must give what opinionShare gives in this thread, whether it runs on its own
// thread or here. The texts' sentiments are wink-nlp's (its.sentiment, the library's English
// lexicon); the clear ones below read as opinions by any reader and the plain ones as none
// (common practice, no source), which also checks that the share counts what it says.
import { strict as assert } from 'node:assert';
import { opinionShare } from '../extension/src/engine/terms/opinion-check';
import { startOpinionShare } from '../extension/src/engine/terms/start-opinion-share';

const TEXTS = [
  'I absolutely love this, it is wonderful and brilliant!',
  'This is terrible, awful and a complete waste of money.',
  'The meeting is on Tuesday at ten in room four.',
  'Fantastic service, great people, I am very happy.',
  'The report lists the totals for each region.',
  'Horrible experience, I hate it and I am angry.',
  'Please find the attached invoice for March.',
];

describe('startOpinionShare', function () {
  this.timeout(60_000);

  it('on its own thread gives the share opinionShare gives here (4 of 7 clear opinions)', () => {
    const here = opinionShare(TEXTS);
    assert.equal(here, 4 / 7);
    const pending = startOpinionShare(TEXTS);
    assert.equal(pending.take(), here);
    assert.ok(pending.fromThread, 'the answer came from this thread, not the other');
  });

  it('computes here without a thread script, and for no texts (0)', () => {
    const noScript = startOpinionShare(TEXTS, null);
    assert.equal(noScript.take(), 4 / 7);
    assert.equal(noScript.fromThread, false);
    assert.equal(startOpinionShare([]).take(), 0);
  });
});
