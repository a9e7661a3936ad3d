import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { peekCoreModel, readCoreModel } from '../extension/src/engine/tokenize/wink-core-model';

// The bundles read wink's core model through wink-core-model.ts instead of
// wink-eng-lite-web-model's read-core-model.js (scripts/build.mjs): it must hand each wink
// instance the very model that reader gives. Source: wink-eng-lite-web-model 1.8.1's
// dist/read-core-model.js, run here beside it.

describe('wink core model reader', () => {
  it('gives what wink-eng-lite-web-model\'s own reader gives, field for field', () => {
    const winksOwn = require('wink-eng-lite-web-model/dist/read-core-model.js') as () => unknown;
    const expected = winksOwn() as Record<string, unknown>;
    const got = readCoreModel() as unknown as Record<string, unknown>;
    assert.deepStrictEqual(Object.keys(got), Object.keys(expected));
    assert.ok(got.lexicon instanceof Uint32Array && got.lexicon.length > 100_000);
    assert.deepStrictEqual(got, expected);
  });

  it('gives each call a model of its own (an instance changes its model)', () => {
    const a = readCoreModel();
    const b = readCoreModel();
    assert.notEqual(a, b);
    assert.notEqual(a.features, b.features);
    assert.notEqual(a.lexicon, b.lexicon);
  });

  it('shows the token regexes the tokenizer\'s tables follow', () => {
    const trex = peekCoreModel().trex;
    assert.ok(trex?.helpers?.splitter !== undefined && trex.ltc !== undefined && trex.ltc.length > 2);
  });

  it('replaces wink\'s reader in every built bundle that holds wink, which is wink\'s own (npm test builds first)', () => {
    const dist = join(__dirname, '..', 'dist');
    const withWink = readdirSync(dist).filter((f) => f.endsWith('.js') && readFileSync(join(dist, f), 'utf8').includes('wink-eng-lite-web-model/dist/load-core-model.js'));
    // wink's code is required from its own bundles (scripts/build.mjs, winkOutside), so that the
    // bundles of a pattern review do not carry it.
    assert.deepEqual(withWink, ['wink-eng-lite-web-model.js']);
    for (const f of ['tokenize-worker.js', 'opinion-thread.js', 'cli.js', 'review-worker.js']) {
      const text = readFileSync(join(dist, f), 'utf8');
      assert.ok(text.includes('require("./wink-eng-lite-web-model.js")') && text.includes('require("./wink-nlp.js")'), f);
      assert.ok(!text.includes('node_modules/wink-nlp/src/'), `${f} holds wink-nlp's code`);
    }
    // One module reads the model for the tokenizer's peek and for the instances (the peek's parse
    // is handed to the next instance): a copy of it in two bundles parsed the model twice a thread.
    const readers = readdirSync(dist).filter((f) => f.endsWith('.js') && readFileSync(join(dist, f), 'utf8').includes('function peekCoreModel('));
    assert.deepEqual(readers, ['wink-core-model.js']);
    assert.ok(readFileSync(join(dist, 'wink-eng-lite-web-model.js'), 'utf8').includes('require("./wink-core-model.js").readCoreModel'));
    for (const f of withWink) {
      const text = readFileSync(join(dist, f), 'utf8');
      assert.ok(!text.includes('JSON.parse(JSON.stringify(originalModel))'), `${f} still copies the model through JSON`);
      assert.ok(!text.includes('eng-core-web-model.json")'), `${f} still requires the model's JSON`);
    }
  });
});
