// The lint gate bites: the import boundaries are reported where they are broken and nowhere else.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { boundaryViolation } from '../../tools/eslint/boundaries.js';

const root = path.resolve(__dirname, '../..');
const at = (rel: string) => path.join(root, rel);

describe('import boundaries', () => {
  it('reports a shared/ file that imports server/ (the fixture file)', async () => {
    const eslint = new ESLint({ cwd: root });
    const text = readFileSync(at('tests/fixtures/lint/shared-imports-server.ts.txt'), 'utf8');
    const [result] = await eslint.lintText(text, { filePath: at('shared/section/probe.ts') });
    const hits = result.messages.filter((m) => m.ruleId === 'sigmaline/boundaries');
    expect(hits).toHaveLength(1);
    expect(hits[0].message).toMatch(/shared\/ must not import from server\//);
    expect(hits[0].line).toBe(3);
  }, 60_000);

  it('accepts the same import in a server file', async () => {
    const eslint = new ESLint({ cwd: root });
    const text = "import { ingestUpload } from './ingest';\nexport const probe = ingestUpload;\n";
    const [result] = await eslint.lintText(text, { filePath: at('server/services/probe.ts') });
    expect(result.messages.filter((m) => m.ruleId === 'sigmaline/boundaries')).toEqual([]);
  }, 60_000);

  it('names each boundary', () => {
    const v = (from: string, to: string) => boundaryViolation(at(from), at(to));
    expect(v('shared/remap/a.ts', 'src/lib/http')).toMatch(/shared\/ must not import from src\//);
    expect(v('shared/remap/a.ts', 'shared/seawater/density')).toBeNull();
    expect(v('server/services/a.ts', 'server/routes/sections')).toMatch(/a service must not import a route/);
    expect(v('server/routes/a.ts', 'server/services/sectionView')).toBeNull();
    expect(v('src/features/castsheet/api.ts', 'server/config')).toMatch(/client must not import server/);
    expect(v('server/app.ts', 'src/App')).toMatch(/server must not import client/);
    expect(v('src/features/castsheet/api.ts', 'src/features/sections/keys')).toMatch(/reaches into "sections"/);
    expect(v('src/features/castsheet/api.ts', 'src/features/sections')).toBeNull();
    expect(v('src/features/castsheet/api.ts', 'src/features/sections/index')).toBeNull();
    expect(v('src/features/castsheet/api.ts', 'src/features/castsheet/types')).toBeNull();
    expect(v('src/routes/Section.tsx', 'src/features/sections/components/SectionFrame')).toMatch(/screen reaches into/);
  });
});
