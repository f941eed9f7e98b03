// The audit trail in words: one sentence for each thing the server records ("Tomas Leivesson
// processed CP-03.csv: 1 cast."). The server records (action, entity, before, after); the route adds
// the name of what it was done to (`subject`: the file, the cast, the line, the member…), looked up
// when the trail is read, since a row may predate its payload carrying the name.
import { FLAG_MEANINGS, type WoceFlag } from './flags';
import { ROLE_LABELS, type Role } from './enums';

export interface AuditFacts {
  actor: string | null;
  action: string;
  entity: string;
  /** the name of what was acted on, when the server could find it */
  subject: string | null;
  before: unknown;
  after: unknown;
}

type Bag = Record<string, unknown>;
const bag = (v: unknown): Bag => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Bag) : {});
const str = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : null);
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const role = (v: unknown) => {
  const r = str(v);
  return r && r in ROLE_LABELS ? ROLE_LABELS[r as Role].toLowerCase() : (r ?? 'a member');
};
const flagWords = (v: unknown) => {
  const f = num(v);
  return f === null ? 'a flag' : `flag ${f} (${FLAG_MEANINGS[f as WoceFlag] ?? 'unknown'})`;
};
const dbar = (a: Bag) =>
  num(a.pFrom) !== null && num(a.pTo) !== null ? `${num(a.pFrom)}–${num(a.pTo)} dbar` : 'some levels';
const because = (a: Bag) => (str(a.reason) ? ` (${str(a.reason)})` : '');

/** What each kind of thing is called in a sentence, with an article. */
export const AUDIT_ENTITIES: Readonly<Record<string, string>> = {
  cruise: 'the cruise',
  station: 'the station',
  station_plan: 'the station plan',
  upload: 'the file',
  cast: 'the cast',
  derived_variable: 'the derived variable',
  layer_set: 'the layer set',
  delivery: 'the delivery',
  line: 'the line',
  invitation: 'an invitation',
  membership: 'the member',
  qc_proposal: 'the QC proposal',
};

type Phrase = (f: AuditFacts & { what: string; a: Bag; b: Bag }) => string;

/** Actions with the same verb whatever they act on. */
const GENERIC: Readonly<Record<string, Phrase>> = {
  create: ({ what }) => `created ${what}`,
  update: ({ what }) => `edited ${what}`,
  delete: ({ what }) => `deleted ${what}`,
};

/**
 * The phrase of every action the server records, by `entity.action` (or `action` alone). A new
 * action needs its phrase here: tests/unit/audit-sentences.test.ts reads the server's audit calls and
 * fails on any action without one.
 */
export const AUDIT_PHRASES: Readonly<Record<string, Phrase>> = {
  'cruise.create': ({ what }) => `created ${what}`,
  'cruise.update': ({ what, a, b }) => {
    const changed = Object.keys(a).filter((k) => JSON.stringify(a[k]) !== JSON.stringify(b[k]));
    return `edited ${what}${changed.length ? ` (${changed.join(', ')})` : ''}`;
  },
  lock: ({ what }) => `locked ${what}; its data can no longer change`,
  unlock: ({ what }) => `unlocked ${what}`,
  column_mapping: ({ a }) =>
    `set the column mapping for the cruise's files${Object.keys(a).length ? ` (${Object.keys(a).length} columns named)` : ''}`,
  intake_answers: () => `answered the intake questions for the cruise's files`,
  'station.create': ({ what }) => `added ${what} to the plan`,
  reorder: ({ a }) =>
    `reordered the station plan${Array.isArray(a.order) ? ` (${plural(a.order.length, 'station')})` : ''}`,
  import_stations: ({ a }) => {
    const n = num(a.created) ?? num(a.count) ?? (Array.isArray(a.order) ? a.order.length : null);
    return `imported stations into the plan${n !== null ? ` (${plural(n, 'station')})` : ''}`;
  },
  upload: ({ what }) => `uploaded ${what}`,
  ingest: ({ what, a }) => `processed ${what}: ${plural(num(a.casts) ?? 0, 'cast')}`,
  reprocess: ({ what, a }) => `reprocessed ${what}: ${plural(num(a.casts) ?? 0, 'cast')}`,
  reprocess_requested: ({ what }) => `asked for ${what} to be processed again`,
  retry: ({ what }) => `retried processing ${what}`,
  remove_upload: ({ what }) => `removed ${what} and the casts read from it`,
  replace_decision: ({ what, a }) =>
    `chose to replace the earlier ${plural(num(a.casts) ?? 0, 'cast')} with those in ${what}`,
  keep_decision: ({ what, a }) =>
    `chose to keep the earlier ${plural(num(a.casts) ?? 0, 'cast')} rather than those in ${what}`,
  replace_cast: ({ what, a }) => {
    const carried = num(a.flagsCarried);
    const file = str(a.file);
    return `replaced ${what}${file ? ` with the version in ${file}` : ''}${carried ? `, carrying ${plural(carried, 'flag edit')} over` : ''}`;
  },
  remove_cast: ({ what, a }) => `removed ${what}${because(a)}`,
  restore_cast: ({ what }) => `restored ${what}`,
  accept_partly_read: ({ what, a }) =>
    `accepted ${what} as partly read${num(a.dropped) !== null ? ` (${plural(num(a.dropped)!, 'line')} not read)` : ''}`,
  reject_partly_read: ({ what }) => `rejected ${what}, which was only partly read`,
  set_flag: ({ what, a }) => {
    const levels = num(a.levels);
    const variable = str(a.variable) ?? 'the';
    const carried = a.carriedFrom ? ', carried over from its earlier version' : '';
    return `set ${flagWords(a.flag)} on ${levels !== null ? plural(levels, `${variable} level`) : `${variable} levels`} of ${what}, ${dbar(a)}${because(a)}${carried}`;
  },
  undo_flag: ({ what, a }) =>
    `undid a flag edit on ${what}${num(a.levels) !== null ? `: ${plural(num(a.levels)!, 'level')} restored` : ''}`,
  qc_accept: ({ what, a }) =>
    `accepted ${what}: ${flagWords(a.flag)} on ${str(a.variable) ?? 'a variable'}, ${dbar(a)}${because(a)}`,
  qc_reject: ({ what, a }) => `rejected ${what} for ${str(a.variable) ?? 'a variable'}, ${dbar(a)}${because(a)}`,
  qc_reopen: ({ what }) => `reopened ${what}`,
  'derived_variable.create': ({ what, a }) => `defined ${what}${str(a.formula) ? ` as ${str(a.formula)}` : ''}`,
  'layer_set.create': ({ what, a }) => `saved ${what}${str(a.levels) ? ` (${str(a.levels)})` : ''}`,
  'delivery.create': ({ what }) => `asked for ${what}`,
  release: ({ what }) => `released ${what} to its readers`,
  'line.create': ({ what }) => `drew ${what}`,
  invite: ({ a }) => `invited ${str(a.email) ?? 'someone'} to join as ${role(a.role)}`,
  accept_invitation: ({ a }) => `joined the team as ${role(a.role)}`,
  change_role: ({ what, a, b }) => `changed the role of ${what} from ${role(b.role)} to ${role(a.role)}`,
  remove_member: ({ what, b }) => `removed ${what} (${role(b.role)}) from the team`,
};

/** The phrase for an action, or null when none is written (the test over every action catches it). */
export function phraseFor(action: string, entity: string): Phrase | null {
  return AUDIT_PHRASES[`${entity}.${action}`] ?? AUDIT_PHRASES[action] ?? GENERIC[action] ?? null;
}

/** One entry of the audit trail as a sentence, ending in one full stop. */
export function auditSentence(f: AuditFacts): string {
  const noun = AUDIT_ENTITIES[f.entity] ?? `the ${f.entity.replace(/_/g, ' ')}`;
  // "the file CP-03.csv", "the cast S05 cast 1" read oddly: a named subject is its name, for files,
  // casts and members; other kinds keep their noun ("the line SR1b").
  const bare = ['upload', 'cast', 'membership', 'qc_proposal'].includes(f.entity);
  const kind = f.entity === 'delivery' ? (str(bag(f.after).kind) ?? str(bag(f.before).kind)) : null;
  const what = kind
    ? `the ${kind} delivery`
    : f.subject
      ? f.entity === 'qc_proposal'
        ? `the QC proposal on ${f.subject}`
        : bare
          ? f.subject
          : `${noun.replace(/^an? /, 'the ')} ${f.subject}`
      : noun;
  const phrase = phraseFor(f.action, f.entity);
  const body = phrase
    ? phrase({ ...f, what, a: bag(f.after), b: bag(f.before) })
    : `${f.action.replace(/_/g, ' ')} ${what}`;
  const text = `${f.actor ?? 'Sigmaline'} ${body}`
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/[.\s]+$/, '');
  return `${text.charAt(0).toUpperCase()}${text.slice(1)}.`;
}
