// The modules `npm run bench` runs, in order. To add one: export from your module
//   export async function bench(): Promise<BenchResult[]>
// and add a line { name, load: () => import('./your-module') } below. A module that fails to
// load (not written yet) is reported and skipped, so the list can name work in progress.

export interface BenchResult {
  name: string;
  value: number;
  unit: string;
  /** The same figure from the reference implementation, when there is one. */
  reference?: number;
  /** What the figure should meet, in words (e.g. "≤ 1.5× reference"). */
  target?: string;
}

export interface BenchModule {
  name: string;
  load: () => Promise<{ bench?: () => Promise<BenchResult[]> }>;
}

export const BENCH_MODULES: BenchModule[] = [
  { name: 'seawater', load: () => import('./seawater-suite') },
  { name: 'ingest', load: () => import('./ingest') },
  { name: 'load', load: () => import('./load') },
  { name: 'remap', load: () => import('./remap') },
  { name: 'deliveries', load: () => import('./deliveries') },
  { name: 'section', load: () => import('./section') },
  { name: 'comparisons', load: () => import('./comparisons') },
  { name: 'parse', load: () => import('./parse') },
  { name: 'browser', load: () => import('./browser') },
];
