import { describe, expect, it } from 'vitest';
import { buildDir } from '../../scripts/processes';
import { profileEnv } from '../../scripts/stack';

// The demo and the tests build into their own folders, so a test run never rebuilds the files a
// running demo serves (and the other way round).
describe('build folders', () => {
	it('are build/ for the demo and build-test/ for the tests', () => {
		// The demo takes settings from the environment, which inside a test run names the test folder.
		const inherited = process.env.RINGDOWN_BUILD_DIR;
		delete process.env.RINGDOWN_BUILD_DIR;
		try {
			expect(buildDir(profileEnv('demo'))).toBe('build');
		} finally {
			if (inherited !== undefined) process.env.RINGDOWN_BUILD_DIR = inherited;
		}
		expect(buildDir(profileEnv('test'))).toBe('build-test');
		expect(buildDir({})).toBe('build');
	});
});
