import * as path from 'node:path';
import type { Report, SettingSourceKind } from '../protocol';

const HOW: Record<NonNullable<Report['provenance']>['config']['how'], string> = {
  given: 'given',
  nearest: 'nearest to the corpus',
  none: 'none found',
  ignored: 'ignored, --no-config',
};

/** A path as short as it can be said: relative to the working folder when inside it. */
function shortPath(file: string, cwd: string): string {
  const rel = path.relative(cwd, file);
  return rel !== '' && !rel.startsWith('..') && !path.isAbsolute(rel) ? rel : file;
}

/**
 * Which loudword.json the review used and where the settings not at their default came from,
 * for the text summary: "Config: data/loudword.json (nearest to the corpus): label, sample.k;
 * flags: --sample". Null for a Report without provenance (made by an older version).
 */
export function provenanceLine(report: Report, cwd = process.cwd()): string | null {
  const p = report.provenance;
  if (p === undefined) return null;
  const config = p.config.file === null ? HOW[p.config.how] : `${shortPath(p.config.file, cwd)} (${HOW[p.config.how]})`;
  const by = new Map<SettingSourceKind, string[]>();
  for (const [key, source] of Object.entries(p.sources)) {
    const list = by.get(source.from) ?? [];
    list.push(source.from === 'loudword.json' ? key : source.where);
    by.set(source.from, list);
  }
  const parts = [`Config: ${config}${by.has('loudword.json') ? `: ${by.get('loudword.json')!.join(', ')}` : ''}`];
  if (by.has('editor setting')) parts.push(`editor settings: ${by.get('editor setting')!.join(', ')}`);
  if (by.has('command-line flag')) parts.push(`flags: ${[...new Set(by.get('command-line flag'))].join(', ')}`);
  if (by.size === 0) parts.push('all settings at their defaults');
  return parts.join('; ');
}
