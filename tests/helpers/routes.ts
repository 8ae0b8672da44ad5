// The app's route list, read from src/routes, so access tests cover every route that exists
// (a new route is covered the day it is added).
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';

export interface RouteInfo {
	path: string; // e.g. /rooms/[roomId=id]
	params: string[]; // e.g. ['roomId']
	kind: 'page' | 'endpoint';
	methods: string[]; // HTTP methods an endpoint exports; GET for pages
	actions: string[]; // form action names of a page
}

const ROUTES_DIR = join(import.meta.dirname, '../../src/routes');

function walk(dir: string, out: string[] = []): string[] {
	for (const e of readdirSync(dir, { withFileTypes: true })) {
		const p = join(dir, e.name);
		if (e.isDirectory()) walk(p, out);
		else out.push(p);
	}
	return out;
}

export function listRoutes(): RouteInfo[] {
	const routes = new Map<string, RouteInfo>();
	for (const file of walk(ROUTES_DIR)) {
		const name = file.split(sep).pop()!;
		if (!['+page.svelte', '+server.ts', '+page.server.ts'].includes(name)) continue;
		const dir = relative(ROUTES_DIR, file).split(sep).slice(0, -1);
		// Route groups "(name)" do not appear in the URL.
		const segments = dir.filter((s) => !/^\(.+\)$/.test(s));
		const path = '/' + segments.join('/');
		const params = [...path.matchAll(/\[(?:\.\.\.)?([A-Za-z]+)(?:=[a-z]+)?\]/g)].map((m) => m[1]);
		const kind = name === '+server.ts' ? 'endpoint' : 'page';
		const key = `${kind}:${path}`;
		const info = routes.get(key) ?? { path, params, kind, methods: kind === 'page' ? ['GET'] : [], actions: [] };
		const source = readFileSync(file, 'utf8');
		if (name === '+server.ts') {
			info.methods = [...source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);
		}
		if (name === '+page.server.ts') {
			const block = source.match(/export const actions = \{([\s\S]*)\} satisfies Actions/);
			if (block) info.actions = [...block[1].matchAll(/^\t([a-zA-Z]+): async/gm)].map((m) => m[1]);
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
