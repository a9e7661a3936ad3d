// The pieces of contractions a stop list gets for scikit-learn's tokens (engine/terms/contraction-pieces.ts).
// Reference: scikit-learn's default analyzer (Debian python3-sklearn, `CountVectorizer().build_analyzer()`),
// run on each contraction of the table: what it keeps that wink-nlp's expansion does not name is the piece.
import { strict as assert } from 'node:assert';
import { execFileSync } from 'node:child_process';
import { DEFAULT_SETTINGS } from '../extension/src/engine/config/default-settings';
import { CONTRACTIONS, contractionPieces, entriesOfThisTokenizer, piecesCompleted } from '../extension/src/engine/terms/contraction-pieces';
import { piecesWith, suggestionLines } from '../extension/src/engine/terms/stop-list-spelling';
import { createTokenizer } from '../extension/src/engine/tokenize/create-tokenizer';

const wink = createTokenizer(DEFAULT_SETTINGS.tokens);
const pattern = createTokenizer({ ...DEFAULT_SETTINGS.tokens, tokenizer: 'pattern' });

function sklearnTokens(texts: readonly string[]): string[][] {
  const script = 'import json,sys\nfrom sklearn.feature_extraction.text import CountVectorizer\na=CountVectorizer().build_analyzer()\nprint(json.dumps([a(t) for t in json.load(sys.stdin)]))';
  return JSON.parse(execFileSync('/usr/bin/python3', ['-c', script], { input: JSON.stringify(texts), encoding: 'utf8' })) as string[][];
}

describe('terms/contraction-pieces', () => {
  it('with wink tokens, each piece is what scikit-learn keeps of a contraction and wink does not name, standing for the words wink names instead', function () {
    this.timeout(60_000);
    const pieces = contractionPieces(wink);
    const analysed = sklearnTokens(CONTRACTIONS);
    CONTRACTIONS.forEach((word, i) => {
      const parts = wink(word);
      const left = analysed[i]!.filter((t) => !parts.includes(t));
      assert.equal(left.length, 1, `${word}: scikit-learn ${JSON.stringify(analysed[i])}, wink ${JSON.stringify(parts)}`);
      assert.deepEqual(pieces.get(left[0]!), parts.filter((t) => !analysed[i]!.includes(t)), word);
    });
    assert.deepEqual(pieces.get('don'), ['do', 'not']);
    assert.deepEqual(pieces.get('ll'), ['will']);
    assert.deepEqual(pieces.get('re'), ['are']);
    // Pieces that are words of their own are not in the table: "won" (won't), "can" (can't).
    assert.equal(pieces.has('won'), false);
    assert.equal(pieces.has('can'), false);
  });

  it('with the pattern tokenizer the pieces are its own tokens: none to add', () => {
    assert.equal(contractionPieces(pattern).size, 0);
  });

  it('a piece is written only when the suggestions complete it: all its words stopped then, one of them suggested', () => {
    const pieces = new Map([['don', ['do', 'not']], ['ll', ['will']]]);
    const noWord = (): boolean => false;
    assert.deepEqual(piecesCompleted(pieces, new Set(['do', 'not', 'the']), () => false, noWord), { don: ['do', 'not'] });
    // "do" kept: "don't" keeps its "do" in the review's tokens, so scikit-learn's "don" stays.
    assert.deepEqual(piecesCompleted(pieces, new Set(['not']), () => false, noWord), {});
    // "do" already in the stop list: suggesting "not" completes it.
    assert.deepEqual(piecesCompleted(pieces, new Set(['not']), (t) => t === 'do', noWord), { don: ['not'] });
    // Both stopped before: nothing for this suggestion to add.
    assert.deepEqual(piecesCompleted(pieces, new Set(['the']), (t) => t === 'do' || t === 'not' || t === 'will', noWord), {});
    // The corpus uses "don" as a word ("Don Knuth"): the list would stop it too, so no piece.
    assert.deepEqual(piecesCompleted(pieces, new Set(['do', 'not', 'will']), () => false, (p) => p === 'don'), { ll: ['will'] });
  });

  it('a stop list gets the pieces after the suggested terms; adding a part of the suggestions adds the pieces it completes', () => {
    const report = { suggestions: ['the', 'do', 'not'], suggestionSpellings: {}, suggestionPieces: { don: ['do', 'not'] } };
    assert.deepEqual(suggestionLines(report), ['the', 'do', 'not', 'don']);
    assert.deepEqual(piecesWith(report, ['do']), []);
    assert.deepEqual(piecesWith(report, ['do'], new Set(['not'])), ['don']);
    assert.deepEqual(piecesWith(report, ['the']), []);
    assert.deepEqual(piecesWith(report, ['not', 'do']), ['don']);
  });

  it('a piece in the stop list is not reported as an entry that never occurs (it occurs in the pipelines it is there for)', () => {
    const entries = [{ term: 'don', written: 'don' }, { term: 'attachmentid', written: 'attachmentid' }];
    assert.deepEqual(entriesOfThisTokenizer(entries, wink).map((e) => e.written), ['attachmentid']);
    assert.deepEqual(entriesOfThisTokenizer(entries, pattern).map((e) => e.written), ['don', 'attachmentid']);
  });
});
