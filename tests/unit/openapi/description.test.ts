// The API description: a valid OpenAPI 3.1 document (checked by @readme/openapi-parser), and a
// complete one — every route under src/routes/api with every method it exports, and nothing else.
import { describe, expect, it } from 'vitest';
import { validate } from '@readme/openapi-parser';
import { isHttpError } from '@sveltejs/kit';
import { listRoutes } from '../../helpers/routes';
import { buildApiDescription } from '../../../src/lib/server/openapi/document';
import { apiOperations } from '../../../src/lib/server/openapi/operations';
import { openApiPath, routeParams, scopeFor } from '../../../src/lib/server/openapi/registry';
import { apiPageView, type ApiDocument } from '../../../src/lib/server/openapi/view';
import { createCaptureSchema, updateCaptureSchema } from '../../../src/lib/schemas/captures';
import { exportFormat } from '../../../src/lib/server/exports';

const settings = { PUBLIC_BASE_URL: 'https://ringdown.example.test', UPLOAD_MAX_BYTES: 200 * 1024 * 1024, BODY_MAX_BYTES: 1024 * 1024, API_TOKEN_REQUESTS_PER_MINUTE: 600 };
const limits = { uploadMaxBytes: settings.UPLOAD_MAX_BYTES, bodyMaxBytes: settings.BODY_MAX_BYTES, tokenRequestsPerMinute: 600, uploadBodyDescription: '401 MiB' };
const doc = buildApiDescription(settings) as unknown as ApiDocument & { openapi: string };
type Op = ApiDocument['paths'][string][string] & { responses: Record<string, unknown>; parameters?: { name: string; in: string; required?: boolean }[] };
const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

const apiRoutes = (await listRoutes()).filter((r) => r.kind === 'endpoint' && r.path.startsWith('/api/'));
const described = Object.entries(doc.paths).flatMap(([path, item]) => METHODS.filter((m) => item[m]).map((m) => ({ path, method: m, op: item[m] as Op })));

describe('the OpenAPI document', () => {
	it('is valid OpenAPI 3.1 by @readme/openapi-parser, with no warnings', async () => {
		expect(doc.openapi).toBe('3.1.0');
		const result = await validate(structuredClone(doc) as never);
		const errors = 'errors' in result ? result.errors : [];
		expect(errors, JSON.stringify(errors)).toEqual([]);
		expect(result.valid).toBe(true);
		expect(result.warnings).toEqual([]);
	});

	it('is refused by the same validator once broken (the check can fail)', async () => {
		const broken = structuredClone(doc) as unknown as { paths: Record<string, Record<string, { parameters?: unknown[]; responses: Record<string, unknown> }>> };
		delete broken.paths['/api/captures/{captureId}'].get.parameters;
		expect((await validate(structuredClone(broken) as never)).valid, 'a path parameter left undescribed').toBe(false);
		const badStatus = structuredClone(doc) as unknown as typeof broken;
		badStatus.paths['/api/captures/{captureId}'].get.responses['2000'] = { description: 'no such status' };
		expect((await validate(badStatus as never)).valid, 'a status that is not one').toBe(false);
	});

	it('describes every route under src/routes/api, with every method it exports', () => {
		expect(apiRoutes.length).toBeGreaterThanOrEqual(17);
		const missing: string[] = [];
		for (const r of apiRoutes) {
			const item = doc.paths[openApiPath(r.path)];
			for (const m of r.methods) if (!item?.[m.toLowerCase()]) missing.push(`${m} ${r.path}`);
		}
		expect(missing, 'routes or methods with no entry in src/lib/server/openapi/operations').toEqual([]);
	});

	it('describes no path or method that does not exist', () => {
		const onDisk = new Set(apiRoutes.flatMap((r) => r.methods.map((m) => `${m.toLowerCase()} ${openApiPath(r.path)}`)));
		const extra = described.map((d) => `${d.method} ${d.path}`).filter((d) => !onDisk.has(d));
		expect(extra, 'entries whose route or method is gone').toEqual([]);
		// The registry's route ids are the routes' own, so parameters and body limits follow them.
		const ids = new Set(apiRoutes.map((r) => r.path));
		for (const op of apiOperations(limits)) expect(ids.has(op.route), op.route).toBe(true);
	});

	it('gives each operation a unique id, a resource, and each path parameter of its route', () => {
		const ids = described.map((d) => d.op.operationId);
		expect(new Set(ids).size).toBe(ids.length);
		const tags = new Set(doc.tags!.map((t) => t.name));
		for (const { path, method, op } of described) {
			expect(tags.has(op.tags![0]), `${method} ${path}`).toBe(true);
			const inPath = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
			const params = (op.parameters ?? []).filter((p) => p.in === 'path');
			expect(params.map((p) => p.name).sort(), `${method} ${path}`).toEqual(inPath.sort());
			for (const p of params) expect(p.required).toBe(true);
		}
	});

	it('lists the refusals each kind of operation can give, in the Problem shape', () => {
		for (const { path, method, op } of described) {
			const statuses = Object.keys(op.responses).map(Number);
			const where = `${method.toUpperCase()} ${path}`;
			if (op['x-permission'] === 'public') {
				expect(op.security, where).toEqual([]);
				continue;
			}
			expect(op.security, where).toEqual([{ sessionCookie: [] }, { bearerToken: [op['x-token-scope']] }]);
			for (const s of [401, 429, 503]) expect(statuses, `${where} ${s}`).toContain(s);
			if (path.includes('{')) expect(statuses, `${where} 404`).toContain(404);
			if (method !== 'get') expect(statuses, `${where} 403`).toContain(403);
			if (op.requestBody) expect(statuses, `${where} 413`).toContain(413);
			for (const s of statuses.filter((s) => s >= 400)) {
				const content = (op.responses[String(s)] as { content: Record<string, { schema: { $ref: string } }> }).content;
				expect(content['application/json'].schema.$ref, `${where} ${s}`).toBe('#/components/schemas/Problem');
			}
		}
	});

	it('names the token scope of each signed-in operation from the token rules', () => {
		expect(scopeFor('project:internal')).toBe('read');
		expect(scopeFor('capture:write')).toBe('upload');
		expect(scopeFor('report:publish')).toBe('review');
		expect(scopeFor('members:manage')).toBeNull();
		const byId = Object.fromEntries(described.map((d) => [d.op.operationId, d.op]));
		expect(byId.getCapture['x-token-scope']).toBe('read');
		expect(byId.uploadCapture['x-token-scope']).toBe('upload');
		expect(byId.getComparison['x-roles']).toEqual(['admin', 'acoustician', 'consultant', 'client']);
		expect(byId.announceCapture['x-roles']).toEqual(['admin', 'acoustician']);
		expect(byId.getApiDescription.security).toEqual([]);
	});

	it('takes request bodies from the schemas the routes parse with', () => {
		const schemas = doc.components!.schemas!;
		expect(Object.keys(schemas.CaptureChange.properties!).sort()).toEqual(Object.keys(updateCaptureSchema.shape).sort());
		expect(Object.keys(schemas.CaptureAnnouncement.properties!).sort()).toEqual(Object.keys(createCaptureSchema(1).shape).sort());
		// The configured upload limit reaches the description.
		expect(schemas.CaptureAnnouncement.properties!.sizeBytes.maximum).toBe(settings.UPLOAD_MAX_BYTES);
		expect(schemas.CaptureAnnouncement.required).toEqual(expect.arrayContaining(['filename', 'sizeBytes', 'sha256', 'kind']));
	});

	it('states the body limits of the settings it was made with', () => {
		const small = buildApiDescription({ ...settings, BODY_MAX_BYTES: 64 * 1024, UPLOAD_MAX_BYTES: 10 * 1024 * 1024, API_TOKEN_REQUESTS_PER_MINUTE: 30 }) as unknown as ApiDocument;
		const patch = small.paths['/api/captures/{captureId}'].patch.responses;
		expect(patch['413'].description).toContain('64 KiB');
		expect(patch['429'].description).toContain('More than 30 requests a minute');
		expect(small.paths['/api/sessions/{sessionId}/captures/upload'].post.responses['413'].description).toContain('20.1 MiB');
	});
});

describe('route parameters', () => {
	it('are read from the route id', () => {
		expect(openApiPath('/api/rooms/[roomId=id]/plan/cutlist')).toBe('/api/rooms/{roomId}/plan/cutlist');
		expect(routeParams('/api/a/[aId=id]/b/[bId]')).toEqual([
			{ name: 'aId', matcher: 'id' },
			{ name: 'bId', matcher: null }
		]);
	});
});

describe('export formats', () => {
	const at = (q: string) => new URL(`http://x.test/api/x${q}`);
	it('default to csv, take json, and refuse anything else with 400', () => {
		expect(exportFormat(at(''))).toBe('csv');
		expect(exportFormat(at('?format=json'))).toBe('json');
		for (const q of ['?format=xml', '?format=', '?format=CSV']) {
			try {
				exportFormat(at(q));
				expect.unreachable(q);
			} catch (e) {
				expect(isHttpError(e) && e.status, q).toBe(400);
			}
		}
	});
});

describe('the readable page', () => {
	const view = apiPageView(doc);

	it('shows every operation once, grouped by resource in the document\'s order', () => {
		const shown = view.resources.flatMap((r) => r.operations.map((o) => `${o.method} ${o.path}`));
		expect(shown.sort()).toEqual(described.map((d) => `${d.method.toUpperCase()} ${d.path}`).sort());
		expect(view.counts.operations).toBe(described.length);
		expect(view.resources.map((r) => r.name)).toEqual(doc.tags!.map((t) => t.name).filter((t) => view.resources.some((r) => r.name === t)));
	});

	it('spells out an operation: access, parameters, body fields, answers and refusals', () => {
		const op = view.resources.flatMap((r) => r.operations).find((o) => o.anchor === 'announceCapture')!;
		expect(op.access).toEqual({ public: false, permission: 'capture:write', roles: ['admin', 'acoustician'], tokenScope: 'upload' });
		expect(op.parameters).toEqual([expect.objectContaining({ in: 'path', name: 'sessionId', type: 'integer > 0', required: true })]);
		const fields = Object.fromEntries(op.body!.media[0].fields.map((f) => [f.name, f]));
		expect(fields.kind).toMatchObject({ type: 'one of impulse, sweep', required: true });
		expect(fields.channel).toMatchObject({ type: 'integer 0 to 7', required: false, description: 'Default 0.' });
		expect(fields['reference.sizeBytes'].type).toBe(`integer 46 to ${settings.UPLOAD_MAX_BYTES}`);
		expect(fields.sha256.type).toBe('string, matching ^[0-9a-f]{64}$');
		expect(op.responses.map((r) => r.status)).toEqual(['201']);
		const created = Object.fromEntries(op.responses[0].media[0].fields.map((f) => [f.name, f]));
		expect(created.capture).toMatchObject({ type: 'Capture', shape: 'Capture' });
		expect(created.referenceUpload).toMatchObject({ type: 'PresignedUpload or null', shape: 'PresignedUpload' });
		expect(op.errors.map((e) => e.status)).toEqual(['400', '401', '403', '404', '409', '413', '422', '429', '503']);
	});

	it('shows the named shapes and the two ways to sign in', () => {
		expect(view.shapes.map((s) => s.name)).toEqual(expect.arrayContaining(['Capture', 'Problem', 'PresignedUpload']));
		const capture = view.shapes.find((s) => s.name === 'Capture')!;
		expect(capture.fields.find((f) => f.name === 'status')!.type).toBe('one of awaiting_upload, queued, analysing, analysed, failed');
		expect(capture.fields.find((f) => f.name === 'headline.t30S')!.type).toBe('number or null');
		expect(view.security.map((s) => s.name)).toEqual(['sessionCookie', 'bearerToken']);
		expect(view.introduction.flat().some((p) => p.kind === 'code' && p.text.startsWith('Authorization: Bearer rdt_'))).toBe(true);
	});
});
