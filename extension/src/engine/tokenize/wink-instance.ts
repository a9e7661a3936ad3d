import type { WinkMethods } from 'wink-nlp';
import { LexemeFilter } from './lexeme-filter';
import { forkOfCoreModel, type LoadedCoreModel } from './wink-model-fork';

/** Which wink-nlp pipe to run: none (tokens only) or sentence boundaries (for bigrams). */
export type WinkPipe = 'tokens' | 'sentences';

const instances = new Map<WinkPipe, WinkMethods>();

/**
 * The wink-nlp instance for a pipe, created on first use and kept: loading the English model
 * takes a few hundred milliseconds, which a review should pay once, and a CLI run that fails
 * before tokenising should not pay at all. The empty pipe skips part-of-speech, entities,
 * negation and sentiment, none of which a bag of words uses.
 */
export function winkInstance(pipe: WinkPipe): WinkMethods {
  let nlp = instances.get(pipe);
  if (nlp === undefined) {
    nlp = freshWinkInstance(pipe);
    instances.set(pipe, nlp);
  }
  return nlp;
}

/**
 * A new wink-nlp instance with its own lexeme cache (a fork of the thread's one read of the model).
 * wink's output depends on what that cache has seen before, so comparing two tokenizer paths
 * needs two instances started from the same state.
 */
export function freshWinkInstance(pipe: WinkPipe): WinkMethods {
  // Required here rather than imported at the top so the model is parsed only when needed.
  const winkNLP = require('wink-nlp') as (model: unknown, pipe: string[]) => WinkMethods;
  // The model wink is given for this instance (once, when it is made), kept to find its lexemes.
  const model = reusableModel();
  let core: LoadedCoreModel | undefined;
  const nlp = winkNLP({ ...model, ...UNUSED_MACHINES, ...(pipe === 'tokens' ? { sbd: () => NO_MACHINES } : {}), core: () => (core = forkOfCoreModel(pristineCore(model))) }, pipe === 'tokens' ? [] : ['sbd']);
  const list = core?.features.lexeme?.list;
  if (Array.isArray(list)) lexemeLists.set(nlp, list);
  assertItsRecognised(nlp);
  return nlp;
}

/**
 * A machine that matches nothing, in the JSON wink-nlp's automaton imports (src/automaton.js
 * `importJSON`: version, last state, transitions, terminal, marked and custom-property states).
 */
const EMPTY_MACHINE = '[100,0,{},{},{},{}]';
const NO_MACHINES = { machines: [] as string[], transformers: [] as unknown[], setter: undefined, updater: undefined };
const ONE_EMPTY_MACHINE = { machines: [EMPTY_MACHINE], transformers: [] as unknown[], setter: undefined };

/**
 * The models of pipes these instances never run, left out. wink-nlp makes an automaton of every
 * model it is given, whatever its pipe: parsing the entities', parts of speech's, negation's and
 * sentiment's machines (~0.5 MB of JSON) took ~4.4 ms of each instance, and a corpus of many
 * files makes one instance a file (matrix/count-each-file.ts). An automaton only looks words up
 * when it is made (never adds one), so leaving them out changes nothing of what the instance's
 * lexeme cache holds; negation and sentiment need one machine each, so they get one that
 * matches nothing.
 */
const UNUSED_MACHINES = { ner: () => NO_MACHINES, pos: () => NO_MACHINES, negation: () => ONE_EMPTY_MACHINE, sa: () => ONE_EMPTY_MACHINE };

const lexemeLists = new WeakMap<WinkMethods, readonly unknown[]>();

/**
 * The lexemes of an instance made by freshWinkInstance, by index (`model.features.lexeme.list`,
 * which the instance's lexeme cache is built from and only ever pushes onto: lexeme-filter.ts);
 * null for an instance made elsewhere, or a model without that list.
 */
export function winkLexemeList(nlp: WinkMethods): readonly unknown[] | null {
  return lexemeLists.get(nlp) ?? null;
}

let modelLexemes: LexemeFilter | undefined;

/**
 * A filter of the lexemes of an instance made by freshWinkInstance (lexeme-filter.ts), started
 * from one of the read model's own lexemes, which every fork's list begins with and the read
 * model never adds to (it is given to no instance); null as for winkLexemeList.
 */
export function winkLexemeFilter(nlp: WinkMethods): LexemeFilter | null {
  const list = lexemeLists.get(nlp);
  const own = pristine?.features.lexeme?.list;
  if (list === undefined || own === undefined) return null;
  modelLexemes ??= new LexemeFilter(own);
  return new LexemeFilter(list, modelLexemes);
}

/** Porter stemmer shipped with the model (the same one `its.stem` calls). */
export function winkStemmer(): (word: string) => string {
  return winkModel().addons.stem;
}

let pristine: LoadedCoreModel | undefined;

/**
 * The core model as wink-nlp loads it, read once per thread and given to no instance: each
 * instance gets a fork of it (wink-model-fork.ts). Reading the 3 MB model is ~100 ms of an
 * instance's ~110 ms, and a corpus of many files makes one instance per file
 * (matrix/count-each-file.ts): 1,000 files took two minutes of reading the same model.
 */
function pristineCore(model: { core(): unknown }): LoadedCoreModel {
  return (pristine ??= model.core() as LoadedCoreModel);
}

let reusable: { core(): unknown } | undefined;

/**
 * The model as wink-nlp may load it any number of times. wink-eng-lite-web-model 1.8's
 * metaCER() JSON-stringifies a module-level value in place, so each call returns the previous
 * answer stringified again (quotes escaped, ~2× longer): the ~10th wink instance of a process
 * fails with "Invalid string length". Its first answer is kept and handed out again.
 */
function reusableModel(): { core(): unknown } {
  if (reusable === undefined) {
    const model = require('wink-eng-lite-web-model') as { core(): unknown; metaCER(): unknown };
    let meta: unknown;
    reusable = { ...model, metaCER: () => (meta ??= model.metaCER()) } as { core(): unknown };
  }
  return reusable;
}

function winkModel(): { addons: { stem: (word: string) => string } } {
  return require('wink-eng-lite-web-model') as { addons: { stem: (word: string) => string } };
}

/**
 * wink-nlp checks an its-function by identity against its own module's set and silently falls
 * back to the surface text when it does not know it. If two copies of wink-nlp end up loaded
 * (a bundler or loader that duplicates modules), every token would then come out unlowercased
 * and typed "word" — garbage no test of the output would flag. Fail loudly instead.
 */
function assertItsRecognised(nlp: WinkMethods): void {
  const tokens = nlp.readDoc("Don't").tokens();
  const normal = (tokens.out(nlp.its.normal) as string[]).join(' ');
  const types = (tokens.out(nlp.its.type) as string[]).join(' ');
  if (normal !== 'do not' || types !== 'word word') {
    throw new Error(`wink-nlp does not recognise its own its-functions (got "${normal}" / "${types}"): two copies of wink-nlp are probably loaded.`);
  }
}
