import { strict as assert } from 'node:assert';
import { flaggedTermAt, flaggedTermSpans } from '../extension/src/host/pure/flagged-term-spans';

// Expected offsets are counted by hand from the literal strings (common practice, no source).
describe('flaggedTermSpans', () => {
  const flagged = new Set(['via', 'submitted', 'ref']);

  it('flaggedTermSpans finds whole words only, case-folded when the review lowercases', () => {
    const line = 'Submitted VIA the app; viaduct and ref-10 and Reference';
    assert.deepEqual(flaggedTermSpans(line, flagged, { lowercase: true }), [
      { term: 'submitted', start: 0, end: 9 },
      { term: 'via', start: 10, end: 13 },
      { term: 'ref', start: 35, end: 38 },
    ]);
  });

  it('flaggedTermSpans is case-sensitive when the review keeps case', () => {
    assert.deepEqual(flaggedTermSpans('Submitted via', flagged, { lowercase: false }), [{ term: 'via', start: 10, end: 13 }]);
  });

  it('flaggedTermSpans stops at max', () => {
    assert.equal(flaggedTermSpans('via via via via', flagged, { lowercase: true, max: 2 }).length, 2);
  });

  it('flaggedTermSpans returns nothing for an empty flag set', () => {
    assert.deepEqual(flaggedTermSpans('via', new Set(), { lowercase: true }), []);
  });

  it('flaggedTermSpans matches letters beyond ASCII and UTF-16 offsets as the editor counts them', () => {
    // "naïve" is 5 code units; the emoji before it is 2 (a surrogate pair) plus a space.
    assert.deepEqual(flaggedTermSpans('😀 naïve café', new Set(['naïve', 'café']), { lowercase: true }), [
      { term: 'naïve', start: 3, end: 8 },
      { term: 'café', start: 9, end: 13 },
    ]);
  });

  it('flaggedTermSpans finds a flagged bigram across whitespace but not across punctuation', () => {
    const bigrams = new Set(['thank you']);
    assert.deepEqual(flaggedTermSpans('Thank  you! thank, you', bigrams, { lowercase: true }), [{ term: 'thank you', start: 0, end: 10 }]);
  });

  it('flaggedTermSpans maps a hashtag to its flagged bare word', () => {
    assert.deepEqual(flaggedTermSpans('see #via', flagged, { lowercase: true }), [{ term: 'via', start: 5, end: 8 }]);
  });
});

describe('flaggedTermAt', () => {
  const flagged = new Set(['via']);
  it('flaggedTermAt finds the term under the cursor, including just after its last letter', () => {
    const line = 'sent via app';
    assert.deepEqual(flaggedTermAt(line, 5, flagged, { lowercase: true }), { term: 'via', start: 5, end: 8 });
    assert.deepEqual(flaggedTermAt(line, 8, flagged, { lowercase: true }), { term: 'via', start: 5, end: 8 });
    assert.equal(flaggedTermAt(line, 2, flagged, { lowercase: true }), null);
  });

  it('flaggedTermAt prefers the unigram when a flagged bigram covers the cursor too', () => {
    const both = new Set(['via', 'via app']);
    assert.deepEqual(flaggedTermAt('sent via app', 6, both, { lowercase: true }), { term: 'via', start: 5, end: 8 });
    assert.deepEqual(flaggedTermAt('sent via app', 10, both, { lowercase: true }), { term: 'via app', start: 5, end: 12 });
  });
});
