// The one way tests and benchmarks run the reference library (Debian's python3-gsw, with numpy and
// netCDF4): the interpreter named by GSW_PYTHON, default /usr/bin/python3 (the python3 first on PATH may
// be another interpreter without the Debian packages).
import { spawnSync } from 'node:child_process';

export const GSW_PYTHON = process.env.GSW_PYTHON || '/usr/bin/python3';

type RunOptions = { input?: string; args?: string[]; maxBuffer?: number };

/** Runs `script` with the reference interpreter and returns what it printed; throws with stderr on failure. */
export function runPython(script: string, { input, args = [], maxBuffer = 1 << 28 }: RunOptions = {}): string {
  const r = spawnSync(GSW_PYTHON, ['-c', script, ...args], { input, encoding: 'utf8', maxBuffer });
  if (r.error) throw r.error;
  if (r.status !== 0) throw new Error(`${GSW_PYTHON} failed (${r.status}): ${r.stderr}`);
  return r.stdout;
}

/** Runs `script` and parses what it printed as JSON. */
export function runPythonJson<T>(script: string, options: RunOptions = {}): T {
  return JSON.parse(runPython(script, options)) as T;
}
