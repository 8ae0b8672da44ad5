import { spawnSync } from 'node:child_process';

/** Debian's interpreter, which has numpy (the pyenv `python3` on PATH does not). */
const PYTHON = '/usr/bin/python3';

/** Runs a Python program that reads JSON from stdin and prints JSON; returns the parsed answer. */
export function runPython<T>(program: string, input: unknown): T {
	const result = spawnSync(PYTHON, ['-c', program], { input: JSON.stringify(input), maxBuffer: 64 * 1024 * 1024 });
	if (result.error || result.status !== 0) {
		throw new Error(`${PYTHON} failed: ${result.error?.message ?? result.stderr.toString()}`);
	}
	return JSON.parse(result.stdout.toString()) as T;
}
