// Every exported function of the seawater core carries TSDoc as the reference library documents its
// functions (issue #11): each parameter with @param and its unit (or what it is), a @returns, and the
// paper, manual or standard the method comes from. Read with the TypeScript compiler's own parser.
import { describe, it, expect } from 'vitest';
import ts from 'typescript';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

const DIR = join(__dirname, '../../shared/seawater');
// a year in a citation, or a standard's name (IOC et al. 2010, UNESCO 1983, IAPWS R13-08, …)
const CITATION = /\b(19|20)\d{2}\b|IAPWS|common practice/;

type Fn = { file: string; name: string; params: string[]; doc: string; tags: ts.JSDocTag[] };

function exportedFunctions(): Fn[] {
  const out: Fn[] = [];
  for (const file of readdirSync(DIR).filter((f) => f.endsWith('.ts') && f !== 'index.ts')) {
    const src = ts.createSourceFile(file, readFileSync(join(DIR, file), 'utf8'), ts.ScriptTarget.Latest, true);
    src.forEachChild((n) => {
      if (!ts.isFunctionDeclaration(n) || !n.modifiers?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword)) return;
      const docs = ts.getJSDocCommentsAndTags(n).filter(ts.isJSDoc);
      out.push({
        file,
        name: n.name!.text,
        params: n.parameters.map((p) => p.name.getText(src)),
        doc: docs.map((d) => d.getText(src)).join('\n'),
        tags: docs.flatMap((d) => [...(d.tags ?? [])]),
      });
    });
  }
  return out;
}

describe('TSDoc of the seawater core', () => {
  const fns = exportedFunctions();
  it('finds the exported functions (the parser works)', () => {
    expect(fns.length).toBeGreaterThan(60);
    expect(fns.map((f) => f.name)).toContain('SA_from_SP');
  });
  it.each(fns.map((f) => [`${f.file} ${f.name}`, f] as const))(
    '%s: @param for each parameter, @returns, a citation',
    (_, f) => {
      const documented = f.tags.filter(ts.isJSDocParameterTag).map((t) => t.name.getText());
      expect(documented, 'every parameter documented, in order').toEqual(f.params);
      for (const t of f.tags.filter(ts.isJSDocParameterTag)) {
        const text = typeof t.comment === 'string' ? t.comment : (t.comment ?? []).map((c) => c.text).join('');
        expect(text.trim().length, `@param ${t.name.getText()} says what it is`).toBeGreaterThan(5);
      }
      expect(
        f.tags.some((t) => t.tagName.text === 'returns'),
        '@returns present',
      ).toBe(true);
      expect(CITATION.test(f.doc), 'names its paper, manual or standard').toBe(true);
    },
  );
});
