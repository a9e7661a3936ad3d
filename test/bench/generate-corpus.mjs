// Seeded benchmark corpora: a CSV `id,topic,text` whose token statistics look like real text,
// so the benchmark exercises the same hash-map sizes, posting-list skew and row lengths a
// practitioner's corpus would. Shape (common practice, no source; the rates are our choices):
// - content words follow a Zipf–Mandelbrot law over 60k pseudo-words (rank frequency ∝ 1/(r+2.7));
// - about 42% of tokens are English function words (they carry roughly that share of running
//   English text), with their own Zipf law, so the loud terms a review should find exist;
// - each document has a topic whose 50 topic words make ~8% of its tokens, so labels mean something;
// - 0.5% of tokens are fresh one-off strings (names, typos, ids) so the vocabulary keeps growing
//   with the corpus the way real vocabularies do (Heaps' law), and ~1% are numbers;
// - lengths 20–200 tokens (right-skewed, mean ~92); ~2% of documents are near-duplicates of a
//   recent one with 1–4 words changed.
// Files are streamed out in chunks and cached by (generator version, size, seed).
import { closeSync, existsSync, mkdirSync, openSync, renameSync, statSync, writeSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { tsImport } from 'tsx/esm/api';

// The engine's own seeded generator (mulberry32), so the project has one.
const { mulberry32 } = await tsImport('../../extension/src/engine/random/seeded-random.ts', import.meta.url);

/** Bump when the output for a given (size, seed) changes, so cached files are not reused. */
export const GENERATOR_VERSION = 1;
export const DATA_DIR = join(dirname(fileURLToPath(import.meta.url)), 'data');

const FUNCTION_WORDS = (
  'the of and to a in is that it for was on with as be by at this are have from or not but ' +
  'an they which you one were all we her she there been his has more if would their will when ' +
  'who so no what can out up about into than them some only could its other time then do two ' +
  'these may any our like over also after new most where how did just such should between because ' +
  'each those both under through very much many while still before here never even well must ' +
  'against without again same own few off why down since upon during every nor however yet ' +
  'although whether among within until often rather around another being made does across ' +
  'either neither none nothing nobody nowhere cannot toward whose whom itself himself herself ' +
  'themselves something anything everything someone anyone everyone perhaps quite already almost ' +
  'though once above below behind beside beyond near onto per via ever always sometimes usually i ' +
  'me my he him us your mine'
).split(' ');

const TOPICS = [
  'billing', 'shipping', 'returns', 'login', 'hardware', 'software', 'network', 'privacy',
  'refunds', 'warranty', 'installation', 'performance', 'pricing', 'accounts', 'mobile',
  'printing', 'storage', 'security', 'training', 'feedback',
];

const CONTENT_WORDS = 60_000;
const TOPIC_WORDS_EACH = 50;
const FUNCTION_SHARE = 0.42;
const TOPIC_SHARE = 0.08;
const FRESH_SHARE = 0.005;
const NUMBER_SHARE = 0.01;
const NEAR_DUPLICATE_SHARE = 0.02;
const RECENT_KEPT = 512;

/** Cumulative weights 1/(r+q)^s, r = 1..n, normalised to end at 1. */
function zipfCdf(n, s, q) {
  const cdf = new Float64Array(n);
  let sum = 0;
  for (let r = 0; r < n; r++) {
    sum += 1 / Math.pow(r + 1 + q, s);
    cdf[r] = sum;
  }
  for (let r = 0; r < n; r++) cdf[r] /= sum;
  return cdf;
}

function drawIndex(cdf, u) {
  let lo = 0;
  let hi = cdf.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (cdf[mid] < u) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

const ONSETS = ['b', 'c', 'd', 'f', 'g', 'h', 'j', 'k', 'l', 'm', 'n', 'p', 'r', 's', 't', 'v', 'w', 'z', 'b', 'c', 'd', 'l', 'm', 'n', 'p', 'r', 's', 't', 'br', 'cl', 'dr', 'gr', 'pl', 'st', 'tr', 'th', 'sh', 'ch', ''];
const VOWELS = ['a', 'e', 'i', 'o', 'u', 'a', 'e', 'i', 'o', 'ai', 'ea', 'ou', 'y'];
const CODAS = ['', '', '', '', '', 'n', 'r', 's', 'l', 'm', 't', 'nd', 'st', 'rk', 'x', 'ng'];

function pseudoWord(random, syllables) {
  let w = '';
  for (let i = 0; i < syllables; i++) {
    w += ONSETS[Math.floor(random() * ONSETS.length)];
    w += VOWELS[Math.floor(random() * VOWELS.length)];
    w += CODAS[Math.floor(random() * CODAS.length)];
  }
  return w;
}

/** Unique lowercase pseudo-words; shorter ones get the frequent ranks, as in real languages. */
function makeVocabulary(random, count, taken) {
  const words = [];
  const seen = new Set(taken);
  while (words.length < count) {
    const syllables = words.length < 1500 ? 1 + Math.floor(random() * 2) : 2 + (random() < 0.3 ? 1 : 0);
    const w = pseudoWord(random, syllables);
    if (w.length < 3 || seen.has(w)) continue;
    seen.add(w);
    words.push(w);
  }
  return words;
}

/** CSV field per RFC 4180: quoted only when it holds a comma, quote or line break. */
function csvField(value) {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Turns a token list into sentences with capitals, commas, end marks and the odd quotation. */
function renderText(random, tokens) {
  let out = '';
  let sentenceStart = true;
  let sentenceLeft = 6 + Math.floor(random() * 15);
  let quoteLeft = random() < 0.05 ? -1 : 0; // -1: a quotation is pending in this document
  for (let i = 0; i < tokens.length; i++) {
    let w = tokens[i];
    if (sentenceStart) w = w[0].toUpperCase() + w.slice(1);
    if (quoteLeft === -1 && random() < 0.1) {
      w = '"' + w;
      quoteLeft = 2 + Math.floor(random() * 3);
    }
    if (quoteLeft > 0 && --quoteLeft === 0) w += '"';
    sentenceStart = false;
    const last = i === tokens.length - 1;
    if (--sentenceLeft === 0 || last) {
      const r = random();
      w += r < 0.85 ? '.' : r < 0.95 ? '?' : '!';
      sentenceStart = true;
      sentenceLeft = 6 + Math.floor(random() * 15);
    } else if (random() < 0.06) {
      w += ',';
    }
    out += last ? w : w + ' ';
  }
  if (quoteLeft > 0) out += '"';
  return out;
}

/** Parses "10k", "1M", "2500" into a document count. */
export function parseSize(text) {
  const m = /^(\d+(?:\.\d+)?)([kKmM]?)$/.exec(String(text).trim());
  if (!m) throw new RangeError(`not a corpus size: ${text} (try 10k, 100k, 1M)`);
  const scale = m[2] === '' ? 1 : m[2].toLowerCase() === 'k' ? 1e3 : 1e6;
  return Math.round(Number(m[1]) * scale);
}

export function sizeLabel(documents) {
  if (documents % 1e6 === 0) return `${documents / 1e6}M`;
  if (documents % 1e3 === 0) return `${documents / 1e3}k`;
  return String(documents);
}

export function corpusPath(documents, seed, dir = DATA_DIR) {
  return join(dir, `corpus-v${GENERATOR_VERSION}-${sizeLabel(documents)}-seed${seed}.csv`);
}

/** Writes the corpus to `file` (through a temporary name, so an interrupted run leaves no cache). */
export function writeCorpus(file, documents, seed) {
  const random = mulberry32(seed);
  const content = makeVocabulary(random, CONTENT_WORDS, FUNCTION_WORDS);
  const contentCdf = zipfCdf(content.length, 1.0, 2.7);
  const functionCdf = zipfCdf(FUNCTION_WORDS.length, 1.0, 1.5);
  const topicCdf = zipfCdf(TOPIC_WORDS_EACH, 0.8, 1);
  // Topic words come from the middle of the frequency range, disjoint between topics.
  const topicWords = TOPICS.map(() => []);
  const used = new Set();
  for (const words of topicWords) {
    while (words.length < TOPIC_WORDS_EACH) {
      const rank = 300 + Math.floor(random() * 8000);
      if (used.has(rank)) continue;
      used.add(rank);
      words.push(content[rank]);
    }
  }
  const recent = []; // [topic, tokens] of recent documents, for near-duplicates

  mkdirSync(dirname(file), { recursive: true });
  const temporary = `${file}.${process.pid}.partial`;
  const fd = openSync(temporary, 'w');
  let chunk = 'id,topic,text\n';
  let tokensWritten = 0;
  let nearDuplicates = 0;
  for (let id = 1; id <= documents; id++) {
    let topic;
    let tokens;
    if (recent.length > 0 && random() < NEAR_DUPLICATE_SHARE) {
      const [t, original] = recent[Math.floor(random() * recent.length)];
      topic = t;
      tokens = original.slice();
      const changes = 1 + Math.floor(random() * 4);
      for (let c = 0; c < changes; c++) {
        tokens[Math.floor(random() * tokens.length)] = content[drawIndex(contentCdf, random())];
      }
      nearDuplicates++;
    } else {
      topic = Math.floor(random() * TOPICS.length);
      const length = 20 + Math.floor(Math.pow((random() + random()) / 2, 1.4) * 181);
      tokens = new Array(length);
      for (let i = 0; i < length; i++) {
        const u = random();
        if (u < FUNCTION_SHARE) tokens[i] = FUNCTION_WORDS[drawIndex(functionCdf, random())];
        else if (u < FUNCTION_SHARE + TOPIC_SHARE) tokens[i] = topicWords[topic][drawIndex(topicCdf, random())];
        else if (u < FUNCTION_SHARE + TOPIC_SHARE + FRESH_SHARE) tokens[i] = pseudoWord(random, 2 + Math.floor(random() * 3));
        else if (u < FUNCTION_SHARE + TOPIC_SHARE + FRESH_SHARE + NUMBER_SHARE) tokens[i] = String(10 + Math.floor(random() * 9990));
        else tokens[i] = content[drawIndex(contentCdf, random())];
      }
    }
    if (recent.length < RECENT_KEPT) recent.push([topic, tokens]);
    else recent[Math.floor(random() * RECENT_KEPT)] = [topic, tokens];
    tokensWritten += tokens.length;
    chunk += `${id},${TOPICS[topic]},${csvField(renderText(random, tokens))}\n`;
    if (chunk.length > 1 << 20) {
      writeSync(fd, chunk);
      chunk = '';
    }
  }
  writeSync(fd, chunk);
  closeSync(fd);
  renameSync(temporary, file);
  return { tokensWritten, nearDuplicates };
}

/** Returns the cached corpus for (documents, seed), generating it first when missing. */
export function ensureCorpus(documents, seed, { dir = DATA_DIR, log = () => {} } = {}) {
  const file = corpusPath(documents, seed, dir);
  if (existsSync(file)) return { file, bytes: statSync(file).size, cached: true, seconds: 0 };
  log(`generating ${sizeLabel(documents)} documents (seed ${seed}) → ${file}`);
  const started = process.hrtime.bigint();
  writeCorpus(file, documents, seed);
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  return { file, bytes: statSync(file).size, cached: false, seconds };
}

// Command line: node test/bench/generate-corpus.mjs --size 10k [--seed 1] [--out file.csv]
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const args = process.argv.slice(2);
  const option = (name, fallback) => {
    const i = args.indexOf(name);
    return i >= 0 && i + 1 < args.length ? args[i + 1] : fallback;
  };
  const documents = parseSize(option('--size', '10k'));
  const seed = Number(option('--seed', '1'));
  const out = option('--out', null);
  if (out) {
    const started = process.hrtime.bigint();
    const info = writeCorpus(out, documents, seed);
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    console.log(JSON.stringify({ file: out, bytes: statSync(out).size, seconds, ...info }));
  } else {
    console.log(JSON.stringify(ensureCorpus(documents, seed, { log: (m) => console.error(m) })));
  }
}
