// No import cycles among the server's services and the shared code: a cycle makes module start-up
// order matter (a value read before its module has run is undefined) and ties two areas into one.
// The graph is made from the static value imports of each file (`import type` is erased and left
// out); the finder is checked first on a small graph with a known cycle, so the test can fail.
import { describe, it, expect } from 'vitest';
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';

const root = resolve(__dirname, '../..');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : /\.ts$/.test(f) ? [p] : [];
  });
}

function target(from: string, spec: string): string | null {
  if (!spec.startsWith('.')) return null;
  const base = resolve(dirname(from), spec);
  for (const c of [`${base}.ts`, join(base, 'index.ts'), base]) if (existsSync(c) && statSync(c).isFile()) return c;
  return null;
}

/** Value imports and re-exports of a file (not `import type` / `export type`). */
export function valueImports(from: string, text: string): string[] {
  const out: string[] = [];
  const re = /(?:^|\n)\s*(import|export)\s+(type\s+)?([^;'"]*?\bfrom\s+)?['"]([^'"]+)['"]/g;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    if (m[2]) continue;
    if (m[1] === 'export' && !m[3]) continue;
    // `import { type A, type B } from` imports no value either
    if (m[3] && /^\{\s*(type\s+\w+\s*(as\s+\w+\s*)?,?\s*)+\}\s*from\s+$/.test(m[3].trim() + ' ')) continue;
    const t = target(from, m[4]);
    if (t) out.push(t);
  }
  return out;
}

/** One cycle of the graph (its nodes, first repeated at the end), or null when there is none. */
export function findCycle(graph: Map<string, string[]>): string[] | null {
  const state = new Map<string, 1 | 2>();
  const stack: string[] = [];
  const visit = (n: string): string[] | null => {
    state.set(n, 1);
    stack.push(n);
    for (const m of graph.get(n) ?? []) {
      if (state.get(m) === 1) return [...stack.slice(stack.indexOf(m)), m];
      if (!state.has(m)) {
        const c = visit(m);
        if (c) return c;
      }
    }
    stack.pop();
    state.set(n, 2);
    return null;
  };
  for (const n of graph.keys())
    if (!state.has(n)) {
      const c = visit(n);
      if (c) return c;
    }
  return null;
}

describe('import cycles', () => {
  it('the finder finds a known cycle and passes a graph without one', () => {
    const g = new Map([
      ['a', ['b']],
      ['b', ['c']],
      ['c', ['a', 'd']],
      ['d', []],
    ]);
    expect(findCycle(g)).toEqual(['a', 'b', 'c', 'a']);
    g.set('c', ['d']);
    expect(findCycle(g)).toBeNull();
  });

  it('reads value imports and leaves type-only ones out', () => {
    const from = join(root, 'server/services/lines.ts');
    const text = [
      "import { loadCruiseCasts } from './cruiseData';",
      "import type { CruiseCast } from './columns';",
      "import { type Line } from '../models/index';",
      "export { readColumns } from './columns';",
    ].join('\n');
    expect(valueImports(from, text).map((p) => relative(root, p))).toEqual([
      'server/services/cruiseData.ts',
      'server/services/columns.ts',
    ]);
  });

  it('none among server/ and shared/ (in particular cruiseData and lines)', () => {
    const graph = new Map<string, string[]>();
    for (const f of [...files(join(root, 'server')), ...files(join(root, 'shared'))])
      graph.set(f, valueImports(f, readFileSync(f, 'utf8')));
    expect(graph.get(join(root, 'server/services/lines.ts'))).toContain(join(root, 'server/services/cruiseData.ts'));
    const cycle = findCycle(graph);
    expect(cycle && cycle.map((p) => relative(root, p)).join(' → ')).toBeNull();
  });
});
