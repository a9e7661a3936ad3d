import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/**
 * wink's English core model (eng-core-web-model.json, 3 MB) as wink-nlp reads it for each
 * instance: in the bundles this module stands in for wink-eng-lite-web-model's read-core-model.js
 * (scripts/build.mjs), which cost ~300 ms of CPU per instance here: it `require`s the JSON once
 * (a parse), then copies it for each instance through JSON.stringify and JSON.parse, and decodes
 * two base64 arrays a character at a time. Parsing the file's text once per instance gives the
 * same object, ~200 ms (docs/performance.md, "Wink's model reads and the tokenising threads'
 * young generation").
 * A wink-nlp instance mutates its model (the lexicon grows), so each one gets a fresh parse.
 */
export type CoreModel = {
  packing: { layout: Record<string, number[]> };
  features: Record<string, { list: unknown[]; hash?: Record<string, number> }>;
  pos: { hash: Record<string, number> };
  trex?: CoreRegexes;
  lexicon: string | Uint32Array;
  xpansions: string | Uint32Array;
};

/** The model's token regexes, which the tokenizer's own tables follow (wink-splitter.ts, deferred-lexemes.ts). */
export type CoreRegexes = { ltc?: [string, string, number][]; helpers?: { splitter?: [string, string] } };

const MODEL_FILE = 'eng-core-web-model.json';

/** Set by esbuild (scripts/build.mjs): the bundles read the model from dist/wink-model/. */
declare const LOUDWORD_WINK_CORE_READER: string | undefined;
const bundled = typeof LOUDWORD_WINK_CORE_READER !== 'undefined';

/** A parse no instance has been given yet (peekCoreModel's), handed to the next readCoreModel. */
let spare: CoreModel | undefined;
let peeked: { trex?: CoreRegexes } | undefined;

/**
 * The file's text, read for each parse rather than kept: it is a two-byte string (a few
 * thousand characters above U+00FF), 6 MB in every thread that makes an instance, and kept it
 * raised a 100k review's peak RSS by ~20 MB; reading it again takes a few milliseconds.
 */
function modelText(): string {
  const file = bundled ? join(__dirname, 'wink-model', MODEL_FILE) : require.resolve(`wink-eng-lite-web-model/dist/languages/cur/models/${MODEL_FILE}`);
  const raw = readFileSync(file, 'utf8');
  // As Node's require of a .json file: a leading byte-order mark is not part of the JSON.
  return raw.charCodeAt(0) === 0xfeff ? raw.slice(1) : raw;
}

/**
 * The model's token regexes (6 kB of its 3 MB). In the bundles they are copied out of a parse
 * that the next instance then takes instead of parsing again (the instance may change its
 * model); from source, the JSON as `require` gives it, the object wink's own reader copies.
 */
export function peekCoreModel(): { trex?: CoreRegexes } {
  if (!bundled) return require(`wink-eng-lite-web-model/dist/languages/cur/models/${MODEL_FILE}`) as CoreModel;
  if (peeked === undefined) {
    const model = JSON.parse(modelText()) as CoreModel;
    peeked = { trex: JSON.parse(JSON.stringify(model.trex ?? null)) ?? undefined };
    spare = model;
  }
  return peeked;
}

/** What wink-eng-lite-web-model 1.8's read-core-model.js returns, field for field (a test compares them). */
export function readCoreModel(): CoreModel {
  const model = spare ?? (JSON.parse(modelText()) as CoreModel);
  spare = undefined;
  const packing = model.packing;
  const featuresData = model.features;
  const pos = model.pos;
  model.lexicon = new Uint32Array(bufferFromBase64(model.lexicon as string));
  model.xpansions = new Uint32Array(bufferFromBase64(model.xpansions as string));
  for (const f in packing.layout) {
    if (packing.layout[f]![3] !== 0) continue;
    const feature = featuresData[f]!;
    const hash: Record<string, number> = Object.create(null);
    for (let k = 0; k < feature.list.length; k += 1) hash[feature.list[k] as string] = k;
    feature.hash = hash;
  }
  const lexeme = featuresData.lexeme!;
  const lexemeHash: Record<string, number> = Object.create(null);
  for (let k = 0; k < lexeme.list.length; k += 1) lexemeHash[lexeme.list[k] as string] = k;
  lexeme.hash = lexemeHash;
  const clusters = featuresData.posClusters!.list;
  for (let k = 0; k < clusters.length; k += 1) clusters[k] = new Set((clusters[k] as string).split('_').map((e) => pos.hash[e] || 0));
  return model;
}

/** The bytes of a base64 string in an ArrayBuffer of their own (wink's decodes through atob). */
function bufferFromBase64(data: string): ArrayBuffer {
  // Buffer.from may hand out a slice of a shared pool: the copy owns exactly these bytes.
  return new Uint8Array(Buffer.from(data, 'base64')).buffer;
}
