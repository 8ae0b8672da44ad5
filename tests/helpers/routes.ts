// The app's route list, read from src/routes, so access tests cover every route that exists
// (a new route is covered the day it is added). Form actions and HTTP methods are read from the
// route modules themselves (imported through Vite, as the app loads them), so an action or a
// handler is found however it is written.
import { readdirSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

export interface RouteInfo {
	path: string; // e.g. /rooms/[roomId=id]
	params: string[]; // e.g. ['roomId']
	kind: 'page' | 'endpoint';
	methods: string[]; // HTTP methods an endpoint exports; GET for pages
	actions: string[]; // form action names of a page
}

const ROUTES_DIR = join(import.meta.dirname, '../../src/routes');
const HTTP_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'];
const ROUTE_FILES = ['+page.svelte', '+server.ts', '+page.server.ts'];

function walk(dir: string, out: string[] = []): string[] {
	for (const e of readdirSync(dir, { withFileTypes: true })) {
		const p = join(dir, e.name);
		if (e.isDirectory()) walk(p, out);
		else out.push(p);
	}
	return out;
}

/** Every route under src/routes; call it from a Vite-run test (it imports the route modules). */
export async function listRoutes(): Promise<RouteInfo[]> {
	const routes = new Map<string, RouteInfo>();
	for (const file of walk(ROUTES_DIR)) {
		const name = file.split(sep).pop()!;
		if (!ROUTE_FILES.includes(name)) continue;
		const dir = relative(ROUTES_DIR, file).split(sep).slice(0, -1);
		// Route groups "(name)" do not appear in the URL.
		const segments = dir.filter((s) => !/^\(.+\)$/.test(s));
		const path = '/' + segments.join('/');
		const params = [...path.matchAll(/\[(?:\.\.\.)?([A-Za-z]+)(?:=[a-z]+)?\]/g)].map((m) => m[1]);
		const kind = name === '+server.ts' ? 'endpoint' : 'page';
		const key = `${kind}:${path}`;
		const info = routes.get(key) ?? { path, params, kind, methods: kind === 'page' ? ['GET'] : [], actions: [] };
		if (name !== '+page.svelte') {
			const module = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
			if (name === '+server.ts') info.methods = HTTP_METHODS.filter((m) => typeof module[m] === 'function');
			else info.actions = Object.keys((module.actions as Record<string, unknown> | undefined) ?? {});
		}
		routes.set(key, info);
	}
	return [...routes.values()].sort((a, b) => a.path.localeCompare(b.path));
}

/** Fill a route's parameters from a map of ids; null when a parameter has no value. */
export function fillRoute(path: string, ids: Record<string, number | string>): string | null {
	let missing = false;
	const url = path.replace(/\[(?:\.\.\.)?([A-Za-z]+)(?:=[a-z]+)?\]/g, (_, name: string) => {
		if (ids[name] === undefined) missing = true;
		return String(ids[name]);
	});
	return missing ? null : url;
}
