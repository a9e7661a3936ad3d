import type { TokenKind } from '../../protocol';

/**
 * The shape of loudword.json, one entry per key of EffectiveSettings. The validator walks this
 * table; loudword.schema.json says the same in JSON Schema for the editor, and a test holds the
 * two together.
 */
export type SettingSpec =
  | { kind: 'enum'; values: ReadonlyArray<string | number> }
  | { kind: 'string'; nullable: boolean }
  | { kind: 'boolean' }
  | { kind: 'integer'; minimum: number; maximum: number }
  /** A document-frequency bound: a whole count, or a fraction of the documents. */
  | { kind: 'df'; countMinimum: number; fractionMaximumInclusive: boolean }
  | { kind: 'enumList'; values: readonly string[] }
  | { kind: 'stringList' }
  | { kind: 'object'; properties: Readonly<Record<string, SettingSpec>> };

export const TOKEN_KINDS: readonly TokenKind[] = [
  'word', 'number', 'url', 'email', 'hashtag', 'mention', 'emoji', 'emoticon', 'symbol', 'punctuation', 'currency', 'ordinal', 'time', 'shortForm',
];

export const SETTINGS_SPEC: { kind: 'object'; properties: Readonly<Record<string, SettingSpec>> } = {
  kind: 'object',
  properties: {
    format: { kind: 'enum', values: ['auto', 'csv', 'tsv', 'jsonl', 'text'] },
    text: { kind: 'string', nullable: true },
    label: { kind: 'string', nullable: true },
    stopList: { kind: 'string', nullable: true },
    tokens: {
      kind: 'object',
      properties: {
        lowercase: { kind: 'boolean' },
        minLength: { kind: 'integer', minimum: 1, maximum: 64 },
        kinds: { kind: 'enumList', values: TOKEN_KINDS },
        stem: { kind: 'boolean' },
        ngrams: { kind: 'enum', values: [1, 2] },
      },
    },
    weighting: {
      kind: 'object',
      properties: {
        tf: { kind: 'enum', values: ['raw', 'sublinear', 'binary'] },
        idf: { kind: 'enum', values: ['smooth', 'plain', 'plainPlusOne', 'none'] },
        norm: { kind: 'enum', values: ['l2', 'l1', 'none'] },
      },
    },
    prune: {
      kind: 'object',
      properties: {
        minDf: { kind: 'df', countMinimum: 1, fractionMaximumInclusive: false },
        maxDf: { kind: 'df', countMinimum: 2, fractionMaximumInclusive: true },
      },
    },
    sample: {
      kind: 'object',
      properties: {
        documents: { kind: 'integer', minimum: 10, maximum: 50000 },
        k: { kind: 'integer', minimum: 1, maximum: 100 },
        seed: { kind: 'integer', minimum: 0, maximum: 4294967295 },
      },
    },
    suggest: {
      kind: 'object',
      properties: {
        max: { kind: 'integer', minimum: 0, maximum: 1000 },
        protect: { kind: 'stringList' },
        functionWordPrior: { kind: 'boolean' },
      },
    },
    limits: {
      kind: 'object',
      properties: {
        maxBytes: { kind: 'integer', minimum: 1024, maximum: Number.MAX_SAFE_INTEGER },
      },
    },
  },
};
