import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { documentPreview, PREVIEW_LENGTH } from '../extension/src/engine/tokenize/document-preview';

// The preview against its definition written the plain way (common practice, no source): every
// run of whitespace (JavaScript's \s, the set documentPreview treats as space) becomes one space,
// the start is trimmed, the first PREVIEW_LENGTH code units are kept, never ending on a high
// surrogate, and the end is trimmed. Texts are drawn to reach both of documentPreview's paths
// (printable ASCII with single spaces, and everything else) and its length limit.
function reference(text: string): string {
  let s = text.replace(/\s+/g, ' ').replace(/^ /, '').slice(0, PREVIEW_LENGTH);
  const last = s.charCodeAt(s.length - 1);
  if (last >= 0xd800 && last <= 0xdbff) s = s.slice(0, -1);
  return s.replace(/ +$/, '');
}

describe('tokenize/document-preview', () => {
  it('equals the plain definition on plain ASCII texts around the length limit', () => {
    const word = 'abcdefghij'.repeat(30);
    for (let length = PREVIEW_LENGTH - 3; length <= PREVIEW_LENGTH + 3; length++) {
      for (let space = length - 3; space <= length; space++) {
        const text = word.slice(0, space) + ' ' + word.slice(space + 1, length) + ' tail';
        assert.equal(documentPreview(text), reference(text), JSON.stringify([length, space]));
      }
    }
    assert.equal(documentPreview('one two  three'), 'one two three');
    assert.equal(documentPreview(' lead'), 'lead');
    assert.equal(documentPreview('tab\there'), 'tab here');
    assert.equal(documentPreview('trailing   '), 'trailing');
    assert.equal(documentPreview(''), '');
  });

  it('equals the plain definition on drawn texts (ASCII, spaces of every kind, accents, surrogate pairs)', () => {
    const unit = fc.oneof(
      { weight: 8, arbitrary: fc.constantFrom(...'abcXYZ09.,;!~'.split('')) },
      { weight: 3, arbitrary: fc.constant(' ') },
      { weight: 1, arbitrary: fc.constantFrom('\t', '\n', '\u00a0', '\u3000', '\u2028', '\ufeff', '\u007f', '\u0001') },
      { weight: 1, arbitrary: fc.constantFrom('é', '東', '\ud83d\ude00') },
    );
    fc.assert(
      fc.property(fc.array(unit, { maxLength: 200 }), (units) => {
        const text = units.join('');
        assert.equal(documentPreview(text), reference(text));
      }),
      { numRuns: 3000, seed: 7 },
    );
  });
});
