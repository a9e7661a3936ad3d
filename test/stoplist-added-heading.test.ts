// Terms added from the editor go under a comment line of their own, not under the user's last
// comment (issue 10 part 4); the old text stays a prefix. Common practice, no source.
import { strict as assert } from 'node:assert';
import { ADDED_TERMS_HEADING, addTermsToStopList } from '../extension/src/engine/stoplist/add-terms-to-stop-list';

const heading = { heading: ADDED_TERMS_HEADING };

describe('addTermsToStopList with a heading', () => {
  it('addTermsToStopList puts new terms under "# added by Loudword" after a blank line', () => {
    const text = 'the\n# kept on purpose: product name\nacme\n';
    assert.equal(addTermsToStopList(text, ['of', 'and'], heading).text, `${text}\n# added by Loudword\nof\nand\n`);
  });

  it('addTermsToStopList adds below its own heading without repeating it', () => {
    const text = 'the\n\n# added by Loudword\nof\n';
    assert.equal(addTermsToStopList(text, ['and'], heading).text, `${text}and\n`);
  });

  it('addTermsToStopList keeps CRLF and a missing final break, and starts an empty file with the heading', () => {
    assert.equal(addTermsToStopList('a\r\nb', ['c'], heading).text, 'a\r\nb\r\n\r\n# added by Loudword\r\nc');
    assert.equal(addTermsToStopList('', ['c'], heading).text, '# added by Loudword\nc\n');
  });

  it('addTermsToStopList without a heading appends plainly, as before', () => {
    assert.equal(addTermsToStopList('a\n# note\n', ['c']).text, 'a\n# note\nc\n');
  });
});
