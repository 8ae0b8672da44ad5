import { describe, expect, it } from 'vitest';
import { startChild, supervise, type Child } from '../../scripts/processes';

// Real child processes (Node itself), short back-off so a test takes seconds.
const node = (code: string) => () => startChild('test process', process.execPath, ['-e', code], {}, true);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
/** Waits for a condition instead of a fixed time: starting Node takes seconds on a loaded machine. */
async function until(condition: () => boolean, timeoutMs: number): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (!condition()) {
		if (Date.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms`);
		await sleep(20);
	}
}

describe('supervise', () => {
	it('starts a process that keeps dying again, doubling the wait up to the cap', async () => {
		const log: string[] = [];
		let starts = 0;
		const start = node('process.exit(3)');
		const s = supervise('failing process', () => (starts++, start()), { minMs: 100, maxMs: 400, healthyAfterMs: 60_000 }, (m) => log.push(m));
		await until(() => log.length >= 4, 25_000);
		await s.stop();
		const after = starts;
		expect(log.slice(0, 4)).toEqual([
			'failing process exited (3); starting it again in 0.1 s',
			'failing process exited (3); starting it again in 0.2 s',
			'failing process exited (3); starting it again in 0.4 s',
			'failing process exited (3); starting it again in 0.4 s'
		]);
		// Every exit was followed by a start, except perhaps the last, whose wait the stop cut short.
		expect(starts - log.length).toBeGreaterThanOrEqual(0);
		expect(starts - log.length).toBeLessThanOrEqual(1);
		// Stopped means stopped: no start after it.
		await sleep(1_000);
		expect(starts).toBe(after);
	}, 30_000);

	it('goes back to the shortest wait after a process ran long enough to count as healthy', async () => {
		const log: string[] = [];
		const s = supervise('process', node('setTimeout(() => process.exit(1), 300)'), { minMs: 100, maxMs: 1_000, healthyAfterMs: 200 }, (m) => log.push(m));
		await until(() => log.length >= 3, 25_000);
		await s.stop();
		for (const line of log) expect(line).toBe('process exited (1); starting it again in 0.1 s');
	}, 30_000);

	it('stops the running process and does not start it again', async () => {
		const log: string[] = [];
		let current: Child | undefined;
		const start = node('setInterval(() => {}, 1000)');
		const s = supervise('long-running process', () => (current = start()), { minMs: 50, maxMs: 50, healthyAfterMs: 60_000 }, (m) => log.push(m));
		await sleep(300);
		expect(current!.process.exitCode).toBeNull();
		await s.stop();
		expect(current!.process.signalCode).toBe('SIGTERM');
		await sleep(500);
		expect(log).toEqual([]);
	}, 10_000);
});
