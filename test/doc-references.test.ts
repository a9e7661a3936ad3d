// Every document the project cites resolves: "docs/methods.md §N" names a numbered section of
// docs/methods.md, `FILE.md "Heading"` names a heading of that file, every *.md path written in the
// code or the docs exists, and every relative Markdown link (with its #anchor) lands. Documents
// outside the repository (design or style notes, methods sheets) are never cited. A house rule,
// no outside source; anchors follow GitHub's heading slugs (lower-case, punctuation dropped,
// spaces → hyphens; from memory).
import { strict as assert } from 'node:assert';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';

const root = path.resolve(__dirname, '..');
const SKIP_DIRS = new Set(['node_modules', 'dist', '.git', '.cache', 'fixtures', 'corpora', 'reference']);
const TEXT = /\.(ts|mts|cts|js|mjs|cjs|sh|py|md|css|json)$/;

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return SKIP_DIRS.has(name) ? [] : walk(p);
    return TEXT.test(name) && name !== 'package-lock.json' ? [p] : [];
  });
}

/** The project's own text files: sources, tests, scripts, docs and top-level files. */
function projectFiles(): string[] {
  const top = readdirSync(root).filter((n) => statSync(path.join(root, n)).isFile() && TEXT.test(n) && n !== 'package-lock.json');
  const dirs = ['extension', 'webview', 'test', 'scripts', 'docs', 'cluster', '.ci'].filter((d) => existsSync(path.join(root, d)));
  return [...top.map((n) => path.join(root, n)), ...dirs.flatMap((d) => walk(path.join(root, d)))];
}

interface Heading {
  text: string;
  slug: string;
}

/** GitHub's anchor for a heading: lower-case, markup and punctuation dropped, spaces → '-'. */
function slugOf(heading: string): string {
  return heading
    .toLowerCase()
    .replace(/[`*_]/g, '')
    .replace(/[^\p{L}\p{N}\s-]/gu, '')
    .trim()
    .replace(/\s/g, '-');
}

const headingCache = new Map<string, Heading[]>();
function headingsOf(file: string): Heading[] {
  let hs = headingCache.get(file);
  if (!hs) {
    hs = [];
    let fenced = false;
    for (const line of readFileSync(file, 'utf8').split(/\r?\n/)) {
      if (/^\s*```/.test(line)) fenced = !fenced;
      const m = !fenced && /^#{1,6}\s+(.*?)\s*#*\s*$/.exec(line);
      if (m) hs.push({ text: m[1]!.replace(/`/g, ''), slug: slugOf(m[1]!) });
    }
    headingCache.set(file, hs);
  }
  return hs;
}

/** A cited document path: from the repository root, else beside the citing file. */
function resolveDoc(cited: string, from: string): string | null {
  for (const p of [path.join(root, cited), path.join(path.dirname(from), cited)]) if (existsSync(p)) return p;
  return null;
}

const rel = (p: string) => path.relative(root, p);

describe('doc references', () => {
  const files = projectFiles();
  const self = path.join(__dirname, 'doc-references.test.ts');

  it('finds the project files and docs/methods.md with its numbered sections 1 to 8', () => {
    assert.ok(files.length > 100, `${files.length} files`);
    const numbers = headingsOf(path.join(root, 'docs', 'methods.md'))
      .map((h) => /^(\d+)\. /.exec(h.text)?.[1])
      .filter(Boolean)
      .map(Number);
    for (let n = 1; n <= 8; n++) assert.ok(numbers.includes(n), `docs/methods.md has no "## ${n}." section`);
  });

  it('cites no document from outside the repository', () => {
    const bad: string[] = [];
    for (const file of files) {
      if (file === self) continue;
      readFileSync(file, 'utf8')
        .split('\n')
        .forEach((line, i) => {
          if (/\b(design|style)\.md\b|\.\.\/shared\b|(?<!docs\/)\bmethods(\.md)?\s+§/i.test(line)) bad.push(`${rel(file)}:${i + 1}: ${line.trim()}`);
        });
    }
    assert.deepEqual(bad, [], 'cite docs/methods.md §N, DEVELOPERS.md, README.md or docs/architecture.md instead');
  });

  it('every "docs/methods.md §N" names a section that exists', () => {
    const sections = new Set(
      headingsOf(path.join(root, 'docs', 'methods.md'))
        .map((h) => /^(\d+)\. /.exec(h.text)?.[1])
        .filter(Boolean),
    );
    const missing: string[] = [];
    let count = 0;
    for (const file of files) {
      const text = readFileSync(file, 'utf8');
      // "docs/methods.md §1, §3", "docs/methods.md §4 and §8", and the line-wrapped "docs/methods.md\n * §6".
      for (const m of text.matchAll(/docs\/methods\.md(?:\s|\*|\/\/)*((?:§\d+(?:\s*(?:,|and|or|–|-)\s*)?)+)/g)) {
        for (const n of m[1]!.matchAll(/§(\d+)/g)) {
          count++;
          if (!sections.has(n[1]!)) missing.push(`${rel(file)}: docs/methods.md §${n[1]}`);
        }
      }
    }
    assert.ok(count >= 40, `only ${count} citations found: is the pattern still right?`);
    assert.deepEqual(missing, []);
  });

  it('every cited Markdown file exists, and a quoted heading after it is one of its headings', () => {
    const missing: string[] = [];
    for (const file of files) {
      if (file === self) continue;
      const text = readFileSync(file, 'utf8');
      for (const m of text.matchAll(/(?<![\w/.-])((?:[\w.-]+\/)*[\w-]+\.md)\b(?: "([^"\n]+)")?/g)) {
        // A citation has a folder (docs/methods.md) or is an upper-case project file (README.md);
        // a bare lower-case name (out.md) is a file a test or a user writes, not a document.
        if (!m[1]!.includes('/') && !/^[A-Z][A-Z_-]*\.md$/.test(m[1]!)) continue;
        const target = resolveDoc(m[1]!, file);
        if (!target) {
          missing.push(`${rel(file)}: ${m[1]} does not exist`);
          continue;
        }
        const quoted = m[2];
        if (quoted && !headingsOf(target).some((h) => h.text.toLowerCase().startsWith(quoted.toLowerCase()))) {
          missing.push(`${rel(file)}: ${m[1]} has no heading "${quoted}"`);
        }
      }
    }
    assert.deepEqual(missing, []);
  });

  it('every relative Markdown link lands on a file, and its #anchor on a heading', () => {
    const broken: string[] = [];
    for (const file of files.filter((f) => f.endsWith('.md'))) {
      const text = readFileSync(file, 'utf8').replace(/```[\s\S]*?```/g, '');
      for (const m of text.matchAll(/\]\(([^)\s]+)\)/g)) {
        const link = m[1]!;
        if (/^[a-z]+:/i.test(link)) continue; // http(s), mailto, vscode…
        const [target, anchor] = link.split('#') as [string, string | undefined];
        const doc = target === '' ? file : path.resolve(path.dirname(file), decodeURIComponent(target));
        if (!existsSync(doc)) {
          broken.push(`${rel(file)}: (${link}) — no such file`);
          continue;
        }
        if (anchor && doc.endsWith('.md') && !headingsOf(doc).some((h) => h.slug === anchor)) broken.push(`${rel(file)}: (${link}) — no such heading`);
      }
    }
    assert.deepEqual(broken, []);
  });
});
