// The security probe's session and limit cases, run against the test server as part of the
// suite: the old cookie after sign-out, 40 sign-ins at once, sign-ins from six addresses, 50 reset
// requests at once and the unknown-versus-known timing each end with nothing got through.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { BASE_URL } from '../helpers/env';

const CASES = ['old cookie after sign-out', '40 sign-ins at once', 'sign-ins from six addresses', '50 reset requests at once', 'unknown vs known account timing'];

describe('scripts/probe-security.ts, sessions and limits', () => {
	it('reports every case tried and none failed', () => {
		const run = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/probe-security.ts', BASE_URL, '--only', CASES.join(',')], { encoding: 'utf8', timeout: 120_000 });
		const out = run.stdout + run.stderr;
		for (const name of CASES) {
			const row = out.split('\n').find((l) => l.startsWith(name));
			expect(row, out).toBeDefined();
			const [tried, refused, failed] = row!.split('|').slice(1).map((c) => Number(c.trim()));
			expect(tried, row).toBeGreaterThan(0);
			expect({ refused, failed }, out).toEqual({ refused: tried, failed: 0 });
		}
		expect(run.status, out).toBe(0);
	}, 150_000);
});
