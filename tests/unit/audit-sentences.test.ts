// The audit trail in words: every action the server records (read from the server's own audit()
// calls, so a new action without a phrase fails here) becomes one sentence that names who did it and
// what it was done to, with no JSON, no "upload upload", and one full stop at the end.
import { describe, it, expect } from 'vitest';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { AUDIT_ENTITIES, auditSentence, phraseFor } from '../../shared/api/audit';

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? sources(p) : p.endsWith('.ts') ? [p] : [];
  });
}
/** (action, entity) of every audit() call: the literals of `action:` (both sides of a ternary) and `entity:`. */
function recordedKinds(): { action: string; entity: string; file: string }[] {
  const out: { action: string; entity: string; file: string }[] = [];
  for (const file of sources('server')) {
    const text = readFileSync(file, 'utf8');
    // audit({ … }) and auditedChange(sequelize, { … }, write) (server/services/changes.ts)
    for (const m of text.matchAll(/(?:audit\(|auditedChange\(\s*[\w.]+,)\s*\{([\s\S]*?)\}\s*[,)]/g)) {
      const body = m[1];
      const actionExpr = /action:\s*([^\n]*?),?\n|action:\s*([^,]*),/.exec(body);
      const entity = /entity:\s*'([a-z_]+)'/.exec(body)?.[1];
      if (!actionExpr || !entity) continue;
      const whole = actionExpr[1] ?? actionExpr[2];
      // a ternary's outcomes, not the literal its condition compares with
      const expr = whole.includes('?') ? whole.slice(whole.indexOf('?')) : whole;
      for (const a of expr.matchAll(/'([a-z_]+)'/g)) out.push({ action: a[1], entity, file });
    }
  }
  return out;
}

const sample = {
  filename: 'CP-03.csv',
  casts: 1,
  stations: 1,
  station: 'CP-03',
  cast: '1',
  file: 'CP-03.csv',
  reason: 'spike',
  variable: 'temperature',
  pFrom: 100,
  pTo: 120,
  flag: 4,
  levels: 11,
  role: 'analyst',
  email: 'tomas@example.test',
  name: 'Main line',
  formula: 'sigma2 - sigma0',
  levelsText: '27:0.1:28',
  kind: 'pressure',
  dropped: 3,
  flagsCarried: 2,
};

describe('audit trail sentences', () => {
  const kinds = recordedKinds();
  it('finds the actions the server records (the scan itself works)', () => {
    const actions = new Set(kinds.map((k) => k.action));
    for (const a of ['upload', 'ingest', 'set_flag', 'invite', 'create', 'release', 'remove_cast'])
      expect(actions).toContain(a);
    expect(kinds.length).toBeGreaterThan(25);
  });
  it('every recorded action kind has its phrase and its entity a name', () => {
    const missing = kinds
      .filter((k) => !phraseFor(k.action, k.entity) || !AUDIT_ENTITIES[k.entity])
      .map((k) => `${k.entity}.${k.action} (${k.file})`);
    expect(missing).toEqual([]);
  });
  it.each(recordedKinds().map((k) => [`${k.entity}.${k.action}`, k] as const))(
    '%s reads as a sentence',
    (_label, k) => {
      const s = auditSentence({
        actor: 'Tomas Leivesson',
        action: k.action,
        entity: k.entity,
        subject: k.entity === 'upload' ? 'CP-03.csv' : k.entity === 'cast' ? 'station CP-03 cast 1' : 'X1',
        before: { ...sample, role: 'technician' },
        after: sample,
      });
      expect(s.startsWith('Tomas Leivesson ')).toBe(true);
      expect(s).toMatch(/[^.]\.$/); // one full stop, at the end
      expect(s).not.toMatch(/[{}[\]"]/); // no JSON
      expect(s).not.toMatch(/\b(\w+) \1\b/i); // no "uploaded upload", "upload upload"
      expect(s).not.toContain('_'); // no raw action or entity names
      expect(s).not.toContain('undefined');
      expect(s).not.toContain('null');
    },
  );
  it('reads as the issue asks for the intake of a file', () => {
    const facts = { actor: 'Tomas Leivesson', entity: 'upload', subject: 'CP-03.csv', before: null };
    expect(auditSentence({ ...facts, action: 'ingest', after: { casts: 1, stations: 1 } })).toBe(
      'Tomas Leivesson processed CP-03.csv: 1 cast.',
    );
    expect(auditSentence({ ...facts, action: 'upload', after: { filename: 'CP-03.csv' } })).toBe(
      'Tomas Leivesson uploaded CP-03.csv.',
    );
    expect(auditSentence({ ...facts, action: 'reprocess', after: { casts: 3 } })).toBe(
      'Tomas Leivesson reprocessed CP-03.csv: 3 casts.',
    );
  });
  it('names the flag, its meaning, the levels and the range of a flag edit; the system when no one', () => {
    expect(
      auditSentence({
        actor: null,
        action: 'set_flag',
        entity: 'cast',
        subject: 'station CP-03 cast 1',
        before: null,
        after: { variable: 'temperature', flag: 4, levels: 11, pFrom: 100, pTo: 120, reason: 'spike' },
      }),
    ).toBe('Sigmaline set flag 4 (bad) on 11 temperature levels of station CP-03 cast 1, 100–120 dbar (spike).');
    expect(
      auditSentence({
        actor: 'Ana',
        action: 'change_role',
        entity: 'membership',
        subject: 'Tomas Leivesson',
        before: { role: 'technician' },
        after: { role: 'analyst' },
      }),
    ).toBe('Ana changed the role of Tomas Leivesson from technician to analyst.');
    // an invitation's address, hidden from those who are not chief scientist, is not guessed at
    expect(
      auditSentence({
        actor: 'Ana',
        action: 'invite',
        entity: 'invitation',
        subject: null,
        before: null,
        after: { role: 'pi' },
      }),
    ).toBe('Ana invited someone to join as principal investigator.');
  });
});
