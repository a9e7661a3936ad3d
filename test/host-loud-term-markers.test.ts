// The corpus view marks only the few loudest suggested terms in view, once each, never on the
// header row (issue 10 part 4; common practice, no source).
import { strict as assert } from 'node:assert';
import { pickLoudTermMarkers } from '../extension/src/host/pure/loud-term-markers';

const loudness = new Map([
  ['the', 0.3],
  ['thanks', 0.05],
  ['please', 0.12],
  ['hi', 0.08],
]);
const lines = [
  { line: 0, text: 'id,topic,the,text' },
  { line: 1, text: '1,billing,"Hi, the invoice is wrong, thanks"' },
  { line: 2, text: '2,login,"Please reset the password"' },
  { line: 3, text: '3,login,"hi again, please help"' },
];

describe('pickLoudTermMarkers', () => {
  it('pickLoudTermMarkers marks the loudest terms in view once each, at their first occurrence', () => {
    const got = pickLoudTermMarkers(lines, loudness, { lowercase: true, maxTerms: 3, headerLine: 0 });
    assert.deepEqual(
      got.map((m) => [m.term, m.line, m.start]),
      [
        ['hi', 1, 11],
        ['the', 1, 15],
        ['please', 2, 9],
      ],
    );
  });

  it('pickLoudTermMarkers never marks the header row', () => {
    const got = pickLoudTermMarkers(lines.slice(0, 1), loudness, { lowercase: true, maxTerms: 3, headerLine: 0 });
    assert.deepEqual(got, []);
    const withoutHeader = pickLoudTermMarkers(lines.slice(0, 1), loudness, { lowercase: true, maxTerms: 3, headerLine: null });
    assert.deepEqual(withoutHeader.map((m) => m.term), ['the']);
  });

  it('pickLoudTermMarkers marks nothing when asked for no terms or given none', () => {
    assert.deepEqual(pickLoudTermMarkers(lines, loudness, { lowercase: true, maxTerms: 0, headerLine: 0 }), []);
    assert.deepEqual(pickLoudTermMarkers(lines, new Map(), { lowercase: true, maxTerms: 3, headerLine: 0 }), []);
  });
});
