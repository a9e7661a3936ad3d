import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';

// The engine's folders form layers: a folder may import only folders below it, never one that
// imports it back. The order is the data flow in docs/architecture.md (a house rule, no source).
const engine = path.resolve(__dirname, '../extension/src/engine');

/** Engine folder → the engine folders its files import (relative imports only). */
function folderImports(): Map<string, Set<string>> {
  const graph = new Map<string, Set<string>>();
  for (const folder of readdirSync(engine)) {
    const dir = path.join(engine, folder);
    if (!statSync(dir).isDirectory()) continue;
    const deps = new Set<string>();
    for (const file of walk(dir)) {
      const source = readFileSync(file, 'utf8');
      for (const m of source.matchAll(/(?:from|import)\s*\(?\s*['"](\.[^'"]+)['"]/g)) {
        const target = path.resolve(path.dirname(file), m[1]!);
        const rel = path.relative(engine, target);
        if (rel.startsWith('..') || !rel.includes(path.sep)) continue; // outside the engine, or a top-level file
        const to = rel.split(path.sep)[0]!;
        if (to !== folder) deps.add(to);
      }
    }
    graph.set(folder, deps);
  }
  return graph;
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    return statSync(p).isDirectory() ? walk(p) : p.endsWith('.ts') ? [p] : [];
  });
}

/** Every folder reachable from `start` by imports. */
function reachable(graph: Map<string, Set<string>>, start: string): Set<string> {
  const seen = new Set<string>();
  const stack = [...(graph.get(start) ?? [])];
  while (stack.length > 0) {
    const f = stack.pop()!;
    if (seen.has(f)) continue;
    seen.add(f);
    stack.push(...(graph.get(f) ?? []));
  }
  return seen;
}

describe('engine folder layers', () => {
  it('no engine folder imports a folder that imports it back (directly or through others)', () => {
    const graph = folderImports();
    assert.ok(graph.size >= 8, `expected the engine's folders, found ${[...graph.keys()].join(', ')}`);
    const cycles = [...graph.keys()].filter((f) => reachable(graph, f).has(f));
    assert.deepEqual(cycles, [], `folders on an import cycle: ${cycles.join(', ')}`);
  });

  it('the test sees a cycle when there is one', () => {
    const graph = new Map([['a', new Set(['b'])], ['b', new Set(['c'])], ['c', new Set(['a'])], ['d', new Set<string>()]]);
    assert.ok(reachable(graph, 'a').has('a'));
    assert.ok(!reachable(graph, 'd').has('d'));
  });
});
