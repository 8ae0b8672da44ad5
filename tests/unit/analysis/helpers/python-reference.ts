import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** Debian's interpreter, which has scipy and numpy (the pyenv `python3` on PATH does not). */
const PYTHON = '/usr/bin/python3';

/** Runs tests/reference/<script> with a JSON request on stdin and returns its JSON answer. */
export function runReference<T>(script: string, request: unknown): T {
	const path = fileURLToPath(new URL(`../../../reference/${script}`, import.meta.url));
	const result = spawnSync(PYTHON, [path], { input: JSON.stringify(request), maxBuffer: 256 * 1024 * 1024 });
	if (result.error || result.status !== 0) {
		throw new Error(
			`reference ${script} failed (needs ${PYTHON} with python3-scipy and python3-numpy): ${result.error?.message ?? result.stderr.toString()}`
		);
	}
	return JSON.parse(result.stdout.toString()) as T;
}
