// A second web server of the built app, on its own port with settings of its own (an unreachable
// database, an https public address…), so a test can change them without disturbing the shared one.
import { startWebServer, waitForHttp, type Child } from '../../scripts/processes';

export interface PrivateServer {
	url: string;
	pid: number;
	stop(): Promise<void>;
}

export async function startPrivateServer(port: number, settings: Record<string, string> = {}, publicUrl = `http://127.0.0.1:${port}`): Promise<PrivateServer> {
	const env: Record<string, string> = {};
	for (const [key, value] of Object.entries(process.env)) if (value !== undefined) env[key] = value;
	Object.assign(env, { PORT: String(port), HOST: '127.0.0.1', ORIGIN: publicUrl, PUBLIC_BASE_URL: publicUrl }, settings);
	const child: Child = startWebServer(env, true);
	const url = `http://127.0.0.1:${port}`;
	try {
		// Any answer will do: /health may rightly say 503 here.
		await waitForHttp(`${url}/signin`, 30_000);
	} catch (e) {
		await child.stop();
		throw e;
	}
	return { url, pid: child.process.pid!, stop: () => child.stop() };
}
