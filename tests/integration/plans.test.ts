import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { inspectPdf, requirePoppler } from '../unit/reports/helpers/poppler';

// Treatment plans through the running app: who may see and change them, bad input refused with
// the reason and nothing written, plans reaching the client only through a published report.
let k: Knex;
let org: number;
let tree: ProjectTree;
let otherTree: ProjectTree;
let consultant: Client;
let acoustician: Client;
let client: Client;
let stranger: Client;
let treatedSessionId: number;

beforeAll(async () => {
	k = testDb();
	org = await makeOrganization(k);
	const clientUser = await makeUser(k, org, 'client');
	tree = await makeProjectTree(k, org, clientUser.id);
	[treatedSessionId] = await k('sessions').insert({ room_id: tree.roomId, condition_label: 'after treatment', measured_on: '2026-11-20' });
	const otherOrg = await makeOrganization(k);
	otherTree = await makeProjectTree(k, otherOrg);
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
	acoustician = await signedInClient((await makeUser(k, org, 'acoustician')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
	stranger = await signedInClient((await makeUser(k, otherOrg, 'consultant')).email, TEST_PASSWORD);
});
afterAll(async () => k.destroy());

const planOf = (roomId: number) => k('treatment_plans').where({ room_id: roomId }).first();
const itemsOf = async (roomId: number) => {
	const plan = await planOf(roomId);
	return plan ? k('treatment_items').where({ plan_id: plan.id }).orderBy('id') : [];
};

/** The form fields of a porous absorber, as the plan page sends them. */
const absorber = (over: Record<string, string> = {}) => ({
	formId: 'add-porous',
	kind: 'porous',
	units: 'mm',
	label: 'Side panel',
	surface: 'left',
	quantity: '2',
	widthMm: '600',
	heightMm: '1200 mm',
	thicknessMm: '100',
	airGapMm: '50',
	preset: 'rock-wool-40',
	flowResistivityKPa: '',
	frameThicknessMm: '18',
	fabricWrapped: 'on',
	...over
});

const diffuser = (over: Record<string, string> = {}) => ({
	formId: 'add-diffuser',
	kind: 'diffuser',
	units: 'mm',
	label: 'Rear diffuser',
	surface: 'back',
	quantity: '1',
	heightMm: '1200',
	sequence: 'quadratic-residue',
	prime: '7',
	designFrequencyHz: '500',
	wellWidthMm: '50',
	finThicknessMm: '6',
	maxDepthMm: '',
	boardThicknessMm: '18',
	...over
});

describe('the plan page', () => {
	it('opens for staff with a prediction from the assumed finishes, and writes nothing on reading', async () => {
		const res = await consultant.get(`/rooms/${tree.roomId}/plan`, { accept: 'text/html' });
		expect(res.status).toBe(200);
		const html = await res.text();
		expect(html).toContain('Predicted reverberation');
		expect(html).toContain('Before you build and hang treatment');
		expect(await planOf(tree.roomId)).toBeUndefined();
		const api = await consultant.get(`/api/rooms/${tree.roomId}/plan`, { accept: 'application/json' });
		expect(api.status).toBe(200);
		const body = await api.json();
		expect(body.evaluation.bands).toHaveLength(8);
		expect(body.evaluation.calibration).toBe('assumed finishes only');
		expect(body.evaluation.bands.every((b: { predictedS: number }) => b.predictedS > 0)).toBe(true);
	});

	it('is closed to the project client (403) and to another organization (404)', async () => {
		for (const path of [`/rooms/${tree.roomId}/plan`, `/rooms/${tree.roomId}/plan/build`, `/api/rooms/${tree.roomId}/plan`, `/api/rooms/${tree.roomId}/plan/cutlist?format=csv`]) {
			expect((await client.get(path, { accept: 'text/html' })).status, path).toBe(403);
			expect((await stranger.get(path, { accept: 'text/html' })).status, path).toBe(404);
		}
		const before = (await itemsOf(tree.roomId)).length;
		expect((await client.postForm(`/rooms/${tree.roomId}/plan?/addItem`, absorber())).status).toBe(403);
		expect((await stranger.postForm(`/rooms/${tree.roomId}/plan?/addItem`, absorber())).status).toBe(404);
		expect((await itemsOf(tree.roomId)).length).toBe(before);
	});
});

describe('items', () => {
	it('are added from the form: the plan is created on the first change, from the first visit, with an audit record', async () => {
		const res = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addItem`, absorber());
		expect(res.status).toBe(200);
		const plan = await planOf(tree.roomId);
		expect(plan.baseline_session_id).toBe(tree.sessionId);
		const [item] = await itemsOf(tree.roomId);
		expect(item).toMatchObject({ kind: 'porous', label: 'Side panel', surface: 'left', quantity: 2 });
		expect(Number(item.width_mm)).toBe(600);
		expect(Number(item.height_mm)).toBe(1200);
		const params = typeof item.params === 'string' ? JSON.parse(item.params) : item.params;
		expect(params).toMatchObject({ kind: 'porous', thicknessMm: 100, airGapMm: 50, flowResistivity: 15_000, presetId: 'rock-wool-40', fabricWrapped: true, withBack: false });
		expect(await k('audit_events').where({ action: 'plan.item_added', entity_id: item.id }).first()).toBeTruthy();
	});

	it('take lengths in inches: "23 5/8 in" and a bare number on an inch page', async () => {
		const res = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addItem`, absorber({ units: 'in', label: 'Inch panel', widthMm: '23 5/8', heightMm: '47 1/4 in', thicknessMm: '4', airGapMm: '0', frameThicknessMm: '3/4' }));
		expect(res.status).toBe(200);
		const item = (await itemsOf(tree.roomId)).find((i) => i.label === 'Inch panel');
		// 25.4 mm per inch exactly (international inch): 23 5/8″ = 600.075 mm, 47 1/4″ = 1200.15 mm
		// (stored to 0.01 mm).
		expect(Math.abs(Number(item.width_mm) - 600.075)).toBeLessThanOrEqual(0.005 + 1e-9);
		expect(Number(item.height_mm)).toBeCloseTo(1200.15, 6);
		const params = typeof item.params === 'string' ? JSON.parse(item.params) : item.params;
		expect(params.thicknessMm).toBeCloseTo(101.6, 6);
		expect(params.frameThicknessMm).toBeCloseTo(19.05, 6);
	});

	it('store a diffuser as wide as its wells and fins: 7 × 50 + 8 × 6 = 398 mm', async () => {
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/addItem`, diffuser())).status).toBe(200);
		const item = (await itemsOf(tree.roomId)).find((i) => i.label === 'Rear diffuser');
		expect(Number(item.width_mm)).toBeCloseTo(398, 6);
	});

	it.each([
		['a quantity of 0', absorber({ quantity: '0' }), 'quantity must lie between 1 and 200'],
		['a width that is not a length', absorber({ widthMm: 'wide' }), 'is not a length'],
		['a 20 m panel', absorber({ widthMm: '20 m' }), 'width must lie between'],
		['an unknown surface', absorber({ surface: 'roof' }), 'Pick a surface'],
		['a flow resistivity off the scale', absorber({ preset: '', flowResistivityKPa: '900' }), 'Flow resistivity between'],
		['wells that are not a prime number', diffuser({ prime: '9' }), 'must be a prime'],
		['more panels than the wall holds', absorber({ quantity: '40' }), 'cover'],
		['a frame too big for its panel', absorber({ widthMm: '100', frameThicknessMm: '50' }), 'cannot be built as sized']
	])('are refused with %s, with the reason, and nothing written', async (_, fields, reason) => {
		const before = (await itemsOf(tree.roomId)).length;
		const res = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addItem`, fields);
		expect(res.status).toBe(400);
		expect(await res.text()).toContain(reason);
		expect((await itemsOf(tree.roomId)).length).toBe(before);
	});

	it("cannot point at another room's problem band, and another room's item cannot be changed or removed from here", async () => {
		const [foreignBand] = await k('problem_bands').insert({ room_id: otherTree.roomId, f_lo_hz: 40, f_hi_hz: 60, severity: 'severe', note: 'elsewhere' });
		const before = (await itemsOf(tree.roomId)).length;
		const res = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addItem`, absorber({ problemBandId: String(foreignBand) }));
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('problem band is of another room');
		expect((await itemsOf(tree.roomId)).length).toBe(before);

		// An item of a second room of the same organization, addressed through this room's page.
		const sibling = await makeProjectTree(k, org);
		expect((await consultant.postForm(`/rooms/${sibling.roomId}/plan?/addItem`, absorber({ label: 'Sibling panel' }))).status).toBe(200);
		const [siblingItem] = await itemsOf(sibling.roomId);
		const update = await consultant.postForm(`/rooms/${tree.roomId}/plan?/updateItem`, absorber({ itemId: String(siblingItem.id), label: 'Hijacked' }));
		expect(update.status).toBe(404);
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/removeItem`, { itemId: String(siblingItem.id) })).status).toBe(404);
		expect((await k('treatment_items').where({ id: siblingItem.id }).first()).label).toBe('Sibling panel');
	});

	it('are changed and removed, each with an audit record', async () => {
		const [first] = await itemsOf(tree.roomId);
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/updateItem`, absorber({ itemId: String(first.id), quantity: '3' }))).status).toBe(200);
		expect((await k('treatment_items').where({ id: first.id }).first()).quantity).toBe(3);
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/removeItem`, { itemId: String(first.id) })).status).toBe(200);
		expect(await k('treatment_items').where({ id: first.id }).first()).toBeUndefined();
		const actions = (await k('audit_events').where({ entity_type: 'treatment_item', entity_id: first.id }).select('action')).map((a) => a.action);
		expect(actions).toEqual(expect.arrayContaining(['plan.item_added', 'plan.item_changed', 'plan.item_removed']));
	});

	it('added twice at once to an unplanned room make one plan with both items', async () => {
		const fresh = await makeProjectTree(k, org);
		const results = await Promise.all([
			consultant.postForm(`/rooms/${fresh.roomId}/plan?/addItem`, absorber({ label: 'A' })),
			acoustician.postForm(`/rooms/${fresh.roomId}/plan?/addItem`, absorber({ label: 'B', surface: 'right' }))
		]);
		expect(results.map((r) => r.status)).toEqual([200, 200]);
		expect(await k('treatment_plans').where({ room_id: fresh.roomId }).count({ n: '*' }).first()).toMatchObject({ n: 1 });
		expect((await itemsOf(fresh.roomId)).map((i) => i.label).sort()).toEqual(['A', 'B']);
	});
});

describe('surfaces, openings and materials', () => {
	it('a finish is set from the built-in table; an unknown key is refused', async () => {
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/setFinish`, { surface: 'floor', materialKey: 'carpet-cotton' })).status).toBe(200);
		expect(await k('room_surfaces').where({ room_id: tree.roomId, surface: 'floor' }).first()).toMatchObject({ material_id: 'carpet-cotton', custom_material_id: null });
		const bad = await consultant.postForm(`/rooms/${tree.roomId}/plan?/setFinish`, { surface: 'floor', materialKey: 'unobtainium' });
		expect(bad.status).toBe(400);
		expect(await bad.text()).toContain('Pick a material from the list');
	});

	it("the practice's own material is used, kept while in use, closed to other organizations, and checked", async () => {
		const bad = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addMaterial`, { formId: 'material', name: 'Bad tile', source: 'typo', a125: '0.1', a250: '0.2', a500: '1.5', a1000: '0.5', a2000: '0.5', a4000: '0.5' });
		expect(bad.status).toBe(400);
		expect(await bad.text()).toContain('must lie between 0 and 1');

		const fields = { formId: 'material', name: 'Slotted ply panel', source: 'maker datasheet 2025', a125: '0.35', a250: '0.6', a500: '0.7', a1000: '0.55', a2000: '0.4', a4000: '0.3' };
		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/addMaterial`, fields)).status).toBe(200);
		const dup = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addMaterial`, fields);
		expect(dup.status).toBe(409);
		const material = await k('custom_materials').where({ organization_id: org, name: 'Slotted ply panel' }).first();
		expect(Number(material.a500)).toBeCloseTo(0.7, 3);

		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/setFinish`, { surface: 'back', materialKey: `custom-${material.id}` })).status).toBe(200);
		const inUse = await consultant.postForm(`/rooms/${tree.roomId}/plan?/removeMaterial`, { formId: 'material', materialId: String(material.id) });
		expect(inUse.status).toBe(409);
		expect(await k('custom_materials').where({ id: material.id }).first()).toBeTruthy();

		// Another organization can neither use nor delete it.
		const foreign = await stranger.postForm(`/rooms/${otherTree.roomId}/plan?/setFinish`, { surface: 'back', materialKey: `custom-${material.id}` });
		expect(foreign.status).toBe(400);
		expect((await stranger.postForm(`/rooms/${otherTree.roomId}/plan?/removeMaterial`, { materialId: String(material.id) })).status).toBe(404);
	});

	it('an opening must fit its wall; a fitting one is stored in metres', async () => {
		const tooBig = await consultant.postForm(`/rooms/${tree.roomId}/plan?/addOpening`, { formId: 'opening', units: 'mm', label: 'Barn door', surface: 'front', widthM: '6', heightM: '2.1', materialKey: 'wooden-door' });
		expect(tooBig.status).toBe(400);
		expect(await tooBig.text()).toContain('does not fit the front surface');
		expect(await k('room_openings').where({ room_id: tree.roomId, label: 'Barn door' }).first()).toBeUndefined();

		expect((await consultant.postForm(`/rooms/${tree.roomId}/plan?/addOpening`, { formId: 'opening', units: 'mm', label: 'Door', surface: 'front', widthM: '0.9', heightM: '2100 mm', materialKey: 'wooden-door' })).status).toBe(200);
		const door = await k('room_openings').where({ room_id: tree.roomId, label: 'Door' }).first();
		expect(Number(door.width_m)).toBeCloseTo(0.9, 6);
		expect(Number(door.height_m)).toBeCloseTo(2.1, 6);
	});
});

describe('settings, stock and the cut list', () => {
	it('refuse a visit of another room and the same visit twice', async () => {
		const foreign = await consultant.postForm(`/rooms/${tree.roomId}/plan?/saveSettings`, { formId: 'settings', baselineSessionId: String(otherTree.sessionId), afterSessionId: '', temperatureC: '20', relativeHumidityPct: '50', currency: 'EUR', notes: '' });
		expect(foreign.status).toBe(400);
		expect(await foreign.text()).toContain('Pick visits of this room');
		const twice = await consultant.postForm(`/rooms/${tree.roomId}/plan?/saveSettings`, { formId: 'settings', baselineSessionId: String(tree.sessionId), afterSessionId: String(tree.sessionId), temperatureC: '20', relativeHumidityPct: '50', currency: 'EUR', notes: '' });
		expect(twice.status).toBe(400);
		const humid = await consultant.postForm(`/rooms/${tree.roomId}/plan?/saveSettings`, { formId: 'settings', baselineSessionId: '', afterSessionId: '', temperatureC: '20', relativeHumidityPct: '120', currency: 'EUR', notes: '' });
		expect(humid.status).toBe(400);
		expect(await humid.text()).toContain('relative humidity must lie between 10 and 100');

		const ok = await consultant.postForm(`/rooms/${tree.roomId}/plan?/saveSettings`, { formId: 'settings', baselineSessionId: String(tree.sessionId), afterSessionId: String(treatedSessionId), temperatureC: '22', relativeHumidityPct: '40', currency: 'usd', notes: 'Cleats into studs.', includeInReport: 'on' });
		expect(ok.status).toBe(200);
		expect(await planOf(tree.roomId)).toMatchObject({ after_session_id: treatedSessionId, currency: 'USD', notes: 'Cleats into studs.', include_in_report: 1 });
	});

	it('stock sheets are added once by name and removed only from their own plan; the kerf is checked', async () => {
		const sheet = { formId: 'stock', units: 'mm', label: 'Birch 18', lengthMm: '2440', widthMm: '1220', thicknessMm: '18', finishedFaces: '1', grain: 'along-length', price: '90' };
		expect((await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, sheet)).status).toBe(200);
		expect((await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, sheet)).status).toBe(409);
		expect((await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, { ...sheet, label: 'Odd', finishedFaces: '3' })).status).toBe(400);
		const badKerf = await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/saveKerf`, { formId: 'kerf', units: 'mm', kerfMm: '25' });
		expect(badKerf.status).toBe(400);
		expect(await badKerf.text()).toContain('saw kerf must lie between');

		const fresh = await makeProjectTree(k, org);
		await acoustician.postForm(`/rooms/${fresh.roomId}/plan/build?/addStock`, { ...sheet, label: 'Elsewhere' });
		const elsewhere = await k('stock_sheets').where({ label: 'Elsewhere' }).first();
		expect((await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/removeStock`, { stockId: String(elsewhere.id) })).status).toBe(404);
		expect(await k('stock_sheets').where({ id: elsewhere.id }).first()).toBeTruthy();
	});

	it('the largest piece the saw takes: both sides or neither, in the form\'s unit; a sheet\'s nominal thickness beside the measured one', async () => {
		const own = await makeProjectTree(k, org);
		const saw = (fields: Record<string, string>) => acoustician.postForm(`/rooms/${own.roomId}/plan/build?/saveSawLimit`, { formId: 'saw', units: 'in', ...fields });
		const half = await saw({ sawMaxLengthMm: '50', sawMaxWidthMm: '' });
		expect(half.status).toBe(400);
		expect(await half.text()).toContain('Give both the length and the width, or leave both empty for whole sheets.');
		// Refused: nothing written, not even the plan row.
		expect(await planOf(own.roomId)).toBeUndefined();
		expect((await saw({ sawMaxLengthMm: '50', sawMaxWidthMm: '50' })).status).toBe(200);
		// 50 in = 1270 mm exactly (1 in = 25.4 mm).
		expect(await planOf(own.roomId)).toMatchObject({ saw_max_length_mm: 1270, saw_max_width_mm: 1270 });
		// Saving the plan's other settings leaves the saw size alone.
		await consultant.postForm(`/rooms/${own.roomId}/plan?/saveSettings`, { formId: 'settings', baselineSessionId: '', afterSessionId: '', temperatureC: '20', relativeHumidityPct: '50', currency: 'USD', notes: '' });
		expect(await planOf(own.roomId)).toMatchObject({ saw_max_length_mm: 1270 });
		expect((await saw({ sawMaxLengthMm: '', sawMaxWidthMm: '' })).status).toBe(200);
		expect(await planOf(own.roomId)).toMatchObject({ saw_max_length_mm: null, saw_max_width_mm: null });
		// Who may: a client of the project may not (403), another practice does not see it (404).
		expect((await client.postForm(`/rooms/${tree.roomId}/plan/build?/saveSawLimit`, { formId: 'saw', units: 'mm', sawMaxLengthMm: '1250', sawMaxWidthMm: '1250' })).status).toBe(403);
		expect((await stranger.postForm(`/rooms/${own.roomId}/plan/build?/saveSawLimit`, { formId: 'saw', units: 'mm', sawMaxLengthMm: '1250', sawMaxWidthMm: '1250' })).status).toBe(404);

		const ply = { formId: 'stock', units: 'in', label: 'Ply 1/2', lengthMm: '96', widthMm: '48', thicknessMm: '15/32', nominalThicknessMm: '1/2', finishedFaces: '2', grain: 'along-length', price: '' };
		expect((await acoustician.postForm(`/rooms/${own.roomId}/plan/build?/addStock`, ply)).status).toBe(200);
		// 15/32 in = 11.906 mm, 1/2 in = 12.7 mm.
		expect(await k('stock_sheets').where({ label: 'Ply 1/2' }).first()).toMatchObject({ thickness_mm: 11.906, nominal_thickness_mm: 12.7 });
		const noNominal = await acoustician.postForm(`/rooms/${own.roomId}/plan/build?/addStock`, { ...ply, label: 'Ply x', nominalThicknessMm: '90' });
		expect(noNominal.status).toBe(400);
		expect(await k('stock_sheets').where({ label: 'Ply x' }).first()).toBeUndefined();
	});

	it('the cut list lays out every piece on the stock, as CSV and JSON', async () => {
		// Without 3/4″ sheet the inch panel's frame cannot be cut, and the export says so.
		const missing = await (await acoustician.get(`/api/rooms/${tree.roomId}/plan/cutlist?format=json`, { accept: 'application/json' })).json();
		expect(missing.problem).toMatch(/frame side" is 19(\.\d)? mm thick; no stock sheet has that thickness/);
		// 3/4″ = 19.05 mm sheet matches the frame (parts lists round to 0.1 mm).
		await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, { formId: 'stock', units: 'in', label: 'Ply 3/4', lengthMm: '96', widthMm: '48', thicknessMm: '3/4', finishedFaces: '1', grain: 'along-length', price: '' });
		await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, { formId: 'stock', units: 'mm', label: 'Birch 6 BB', lengthMm: '2440', widthMm: '1220', thicknessMm: '6', finishedFaces: '2', grain: 'along-length', price: '45' });
		await acoustician.postForm(`/rooms/${tree.roomId}/plan/build?/addStock`, { formId: 'stock', units: 'mm', label: 'Utility 18', lengthMm: '2440', widthMm: '1220', thicknessMm: '18', finishedFaces: '0', grain: 'none', price: '' });
		const json = await (await acoustician.get(`/api/rooms/${tree.roomId}/plan/cutlist?format=json`, { accept: 'application/json' })).json();
		expect(json.schema).toBe('ringdown.cut-list/1');
		expect(json.problem).toBeNull();
		expect(json.pieces.length).toBeGreaterThan(10);
		expect(json.pieces.every((p: { sheet: string | null }) => p.sheet !== null)).toBe(true);
		const csv = await (await acoustician.get(`/api/rooms/${tree.roomId}/plan/cutlist?format=csv&units=in`)).text();
		const lines = csv.trimEnd().split('\r\n');
		expect(lines[0]).toContain('Length (in)');
		expect(lines).toHaveLength(json.pieces.length + 1);

		const page = await (await acoustician.get(`/rooms/${tree.roomId}/plan/build`, { accept: 'text/html' })).text();
		expect(page).toContain('Cut list');
		expect(page).toContain('data-testid="cut-sheet"');
		expect(page).toContain('respirator');
	});
});

describe('the plan in the client report', () => {
	it('shows once the report is published and the plan is shared; not otherwise', async () => {
		const [comparisonId] = await k('comparisons').insert({ room_id: tree.roomId, baseline_session_id: tree.sessionId, treated_session_id: treatedSessionId, title: 'Plan report', published_at: new Date() });
		const shared = await (await client.get(`/reports/${comparisonId}`, { accept: 'text/html' })).text();
		expect(shared).toContain('Treatment plan');
		expect(shared).toContain('Rear diffuser (diffuser, 398 mm × 1200 mm) on the back wall');

		requirePoppler();
		const pdf = await client.get(`/api/comparisons/${comparisonId}/report.pdf`);
		expect(pdf.status).toBe(200);
		const text = inspectPdf(new Uint8Array(await pdf.arrayBuffer())).text;
		expect(text).toContain('Treatment plan');
		expect(text).toContain('Rear diffuser');

		await k('treatment_plans').where({ room_id: tree.roomId }).update({ include_in_report: false });
		const hidden = await (await client.get(`/reports/${comparisonId}`, { accept: 'text/html' })).text();
		expect(hidden).not.toContain('Rear diffuser (diffuser');
		await k('treatment_plans').where({ room_id: tree.roomId }).update({ include_in_report: true });
	});
});
