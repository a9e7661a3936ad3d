// The top of the panel: which file, how much of it, with which settings, and anything the
// reader must know before trusting the numbers (a cut-off input, skipped rows).

import type { Report } from '../../extension/src/protocol';
import { el, type Child } from './create-element';
import { formatBytes, formatCount, formatNumber } from './format';
import { skippedWording } from '../../extension/src/skipped-wording';
import { stopListInForce, stopListSize } from '../../extension/src/stop-list-wording';

export function renderReportHeader(report: Report, actions: readonly HTMLElement[]): HTMLElement {
  const input = report.input;
  const facts: Child[] = [
    fact('documents', formatCount(input.documents)),
    fact('terms', formatCount(report.vocabulary.terms)),
    fact('mean length', `${formatNumber(report.vocabulary.meanDocLength)} tokens`),
    fact('format', input.format),
    input.textField ? fact('text', input.textField) : null,
    input.labelField ? fact('label', input.labelField) : null,
    fact('sample', `${formatCount(report.baseline.sample.documents)} docs, k = ${report.baseline.sample.k}`),
  ];
  const notes: Child[] = [];
  if (input.truncated) {
    notes.push(
      el('p', {
        className: 'lw-note lw-note--warn',
        text: `Only the first ${formatBytes(input.truncated.bytesRead)} were read (limit ${formatBytes(input.truncated.limitBytes)}); the numbers describe that part of the file.`,
      }),
    );
  }
  if (input.skipped > 0) {
    const examples = input.skippedExamples ?? [];
    const wording = skippedWording(input.format);
    const summary = `${formatCount(input.skipped)} ${wording.unit}${input.skipped === 1 ? '' : 's'} skipped`;
    notes.push(
      examples.length > 0
        ? el('details', { className: 'lw-note' }, [
            el('summary', { text: summary }),
            el('ul', {}, examples.map((x) => el('li', { text: wording.example(x) }))),
          ])
        : el('p', { className: 'lw-note', text: summary }),
    );
  }
  // What the reader and the review had to say (an encoding read as windows-1252, files read as
  // one corpus, exact duplicates), as the CLI prints them.
  for (const note of input.notes ?? []) notes.push(el('p', { className: 'lw-note', text: note }));
  const provenance = renderProvenance(report);
  if (provenance !== null) notes.unshift(provenance);
  return el('header', { className: 'lw-header' }, [
    el('div', { className: 'lw-header__top' }, [
      el('div', { className: 'lw-header__title' }, [
        el('h1', { text: 'Distance Review' }),
        el('span', { className: 'lw-file', text: input.file, attrs: { title: input.file } }),
      ]),
      el('div', { className: 'lw-header__actions' }, actions),
    ]),
    el('dl', { className: 'lw-facts' }, facts),
    ...notes,
  ]);
}

const HOW: Record<NonNullable<Report['provenance']>['config']['how'], string> = {
  given: 'given',
  nearest: 'nearest to the corpus',
  none: 'none found',
  ignored: 'ignored',
};

/**
 * Which loudword.json and stop list the review used, and where each setting not at its default
 * came from (the file's line, a flag, an editor setting), one click away: the summary line says
 * the config and the stop list, the table the rest. Null for a Report without provenance.
 */
export function renderProvenance(report: Report): HTMLElement | null {
  const p = report.provenance;
  if (p === undefined) return null;
  // "Settings without a loudword.json (none found)", never "Settings from no loudword.json".
  const config = p.config.file === null ? `without a loudword.json (${HOW[p.config.how]})` : `from ${baseName(p.config.file)} (${HOW[p.config.how]})`;
  const stop = report.stopList.file === null ? 'no stop list' : `stop list ${baseName(report.stopList.file)}`;
  const keys = Object.keys(p.sources).sort();
  const rows = keys.map((key) => {
    const source = p.sources[key]!;
    return el('tr', { attrs: { 'data-setting': key } }, [
      el('td', { className: 'lw-provenance__key', text: key }),
      el('td', { className: 'lw-provenance__value', text: settingValue(report.settings, key) }),
      el('td', { text: source.from }),
      el('td', { className: 'lw-provenance__where', text: source.where, attrs: { title: source.where } }),
    ]);
  });
  return el('details', { className: 'lw-note lw-provenance' }, [
    el('summary', { text: `Settings ${config}; ${stop}` }),
    el('p', {}, [
      'Config: ',
      el('span', { className: 'lw-provenance__path', text: p.config.file ?? HOW[p.config.how] }),
      el('br', {}),
      'Stop list: ',
      el('span', { className: 'lw-provenance__path', text: report.stopList.file ?? 'none' }),
      ` (${stopListSize(report.stopList)})`,
    ]),
    keys.length === 0
      ? el('p', { text: 'Every setting is at its default.' })
      : el('table', { className: 'lw-provenance__table' }, [
          el('thead', {}, [el('tr', {}, ['setting', 'value', 'from', 'where'].map((h) => el('th', { text: h })))]),
          el('tbody', {}, rows),
        ]),
    keys.length === 0 ? null : el('p', { text: 'Every other setting is at its default.' }),
  ]);
}

function baseName(file: string): string {
  return file.split(/[\\/]/).pop() || file;
}

/** A setting's value by dotted key ("sample.k") as the review used it. */
function settingValue(settings: Report['settings'], key: string): string {
  let at: unknown = settings;
  for (const part of key.split('.')) at = at !== null && typeof at === 'object' ? (at as Record<string, unknown>)[part] : undefined;
  if (at === undefined) return '';
  return typeof at === 'string' ? at : JSON.stringify(at);
}

function fact(name: string, value: string): HTMLElement {
  return el('div', { className: 'lw-fact' }, [el('dt', { text: name }), el('dd', { text: value })]);
}

/** The settings the review used and the stop list in force, for the footer. */
export function renderSettingsFooter(report: Report): HTMLElement {
  const s = report.settings;
  const stop = report.stopList;
  const lines: string[] = [
    `Weighting: tf ${s.weighting.tf}, idf ${s.weighting.idf}, norm ${s.weighting.norm}.`,
    `Tokens: ${s.tokens.lowercase ? 'lowercased' : 'case kept'}, min length ${s.tokens.minLength}, ${s.tokens.ngrams === 2 ? 'uni- and bigrams' : 'unigrams'}${s.tokens.stem ? ', stemmed' : ''}; kinds ${s.tokens.kinds.join(', ')}.`,
    `Pruning: min df ${formatNumber(s.prune.minDf)}, max df ${formatNumber(s.prune.maxDf)}. Sample: ${formatCount(s.sample.documents)} documents, k = ${s.sample.k}, seed ${s.sample.seed}.`,
    `Stop list: ${stopListInForce(stop)}.`,
  ];
  return el('footer', { className: 'lw-footer' }, [
    ...lines.map((text) => el('p', { text })),
    el('p', { className: 'lw-footer__tool', text: `${report.tool.name} ${report.tool.version}` }),
  ]);
}
