// `npm run bench`: run every module listed in tests/bench/modules.ts and print one line per
// figure — ours, the reference where there is one, the ratio ours / reference and the target.
import { BENCH_MODULES, type BenchResult } from './modules';

function line(module: string, r: BenchResult): string {
  const value = `${r.value.toFixed(r.value < 10 ? 2 : 1)} ${r.unit}`;
  const ref =
    r.reference === undefined
      ? ''
      : `  reference ${r.reference.toFixed(r.reference < 10 ? 2 : 1)} ${r.unit}  ratio ${(r.value / r.reference).toFixed(2)}`;
  const target = r.target ? `  target ${r.target}` : '';
  return `[${module}] ${r.name}: ${value}${ref}${target}`;
}

async function main(): Promise<void> {
  const only = process.argv.slice(2);
  for (const m of BENCH_MODULES) {
    if (only.length && !only.includes(m.name)) continue;
    let mod: Awaited<ReturnType<typeof m.load>>;
    try {
      mod = await m.load();
    } catch (err) {
      console.log(`[${m.name}] skipped: cannot load (${(err as Error).message.split('\n')[0]})`);
      continue;
    }
    if (typeof mod.bench !== 'function') {
      console.log(`[${m.name}] skipped: exports no bench()`);
      continue;
    }
    for (const r of await mod.bench()) console.log(line(m.name, r));
  }
}

// Exits when done: a module's app may leave handles open (pools, job workers) after its close.
main().then(
  () => process.exit(process.exitCode ?? 0),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
