// Input chains of a visit (calibration and microphone correction) and the levels stored with
// each analysis.
import type { Knex } from 'knex';
import type { ChainCalibration } from '../../analysis/calibration';
import type { CaptureLevels, InputChainLevels } from '../../analysis/input-chain';
import type { CorrectionPoint, CorrectionSense } from '../../analysis/mic-correction';
import { readJson } from '../json-column';

export interface InputChainRow {
	id: number;
	sessionId: number;
	/** 0-based channel of the capture files; null: every channel of the visit. */
	channel: number | null;
	label: string | null;
	calibration: {
		objectKey: string;
		filename: string;
		sha256: string;
		sizeBytes: number;
		fileChannel: number;
		statedLevelDbSpl: number;
		toneDbfs: number;
		offsetDb: number;
		details: ChainCalibration;
		byName: string | null;
		at: Date;
	} | null;
	correction: {
		filename: string;
		points: CorrectionPoint[];
		comments: string[];
		sense: CorrectionSense;
		byName: string | null;
		at: Date;
	} | null;
}

function shape(r: Record<string, any>): InputChainRow {
	return {
		id: r.id,
		sessionId: r.session_id,
		channel: r.channel,
		label: r.label,
		calibration:
			r.offset_db === null
				? null
				: {
						objectKey: r.calibrator_object_key,
						filename: r.calibrator_filename,
						sha256: r.calibrator_sha256,
						sizeBytes: Number(r.calibrator_size_bytes),
						fileChannel: r.calibrator_channel,
						statedLevelDbSpl: Number(r.stated_level_db_spl),
						toneDbfs: Number(r.tone_dbfs),
						offsetDb: Number(r.offset_db),
						details: readJson(r.calibration),
						byName: r.calibrated_by_name ?? null,
						at: r.calibrated_at
					},
		correction:
			r.correction_points === null
				? null
				: {
						filename: r.correction_filename,
						points: readJson(r.correction_points),
						comments: readJson(r.correction_comments) ?? [],
						sense: r.correction_sense,
						byName: r.corrected_by_name ?? null,
						at: r.corrected_at
					}
	};
}

function chains(k: Knex) {
	return k('input_chains as ic')
		.leftJoin('users as cu', 'cu.id', 'ic.calibrated_by')
		.leftJoin('users as ku', 'ku.id', 'ic.corrected_by')
		.select('ic.*', 'cu.name as calibrated_by_name', 'ku.name as corrected_by_name');
}

const channelIs = (q: Knex.QueryBuilder, channel: number | null) => (channel === null ? q.whereNull('ic.channel') : q.where('ic.channel', channel));

export async function listChains(k: Knex, sessionId: number): Promise<InputChainRow[]> {
	const rows = await chains(k).where('ic.session_id', sessionId).orderByRaw('ic.channel IS NOT NULL, ic.channel');
	return rows.map(shape);
}

/** The chain of a visit for one channel (null: the visit-wide one), locked when given a transaction that asks. */
export async function getChain(k: Knex, sessionId: number, channel: number | null, forUpdate = false): Promise<InputChainRow | undefined> {
	const q = channelIs(chains(k).where('ic.session_id', sessionId), channel).first();
	const r = await (forUpdate ? q.forUpdate() : q);
	return r ? shape(r) : undefined;
}

/** The chain a capture was recorded through: its channel's own, else the visit-wide one. */
export async function chainForCapture(k: Knex, sessionId: number, channel: number): Promise<InputChainRow | undefined> {
	const r = await chains(k)
		.where('ic.session_id', sessionId)
		.where((q) => q.where('ic.channel', channel).orWhereNull('ic.channel'))
		.orderByRaw('ic.channel IS NULL')
		.first();
	return r ? shape(r) : undefined;
}

/** What the levels of an analysis need of a chain. */
export function chainLevels(chain: InputChainRow | undefined): InputChainLevels | null {
	if (!chain || (!chain.calibration && !chain.correction)) return null;
	return {
		id: chain.id,
		offsetDb: chain.calibration?.offsetDb ?? null,
		statedLevelDbSpl: chain.calibration?.statedLevelDbSpl ?? null,
		correction: chain.correction && { filename: chain.correction.filename, points: chain.correction.points, sense: chain.correction.sense }
	};
}

/** Lock the visit's row so changes to its chains run one after another. */
export async function lockSession(trx: Knex.Transaction, sessionId: number): Promise<void> {
	await trx('sessions').where({ id: sessionId }).forUpdate().first('id');
}

async function ensureChain(trx: Knex.Transaction, sessionId: number, channel: number | null, label: string | null): Promise<number> {
	const existing = await getChain(trx, sessionId, channel, true);
	if (existing) {
		if (label !== null) await trx('input_chains').where({ id: existing.id }).update({ label });
		return existing.id;
	}
	const [id] = await trx('input_chains').insert({ session_id: sessionId, channel, label });
	return id;
}

export interface CalibrationWrite {
	objectKey: string;
	filename: string;
	sha256: string;
	sizeBytes: number;
	fileChannel: number;
	calibration: ChainCalibration;
	by: number | null;
}

export async function setCalibration(trx: Knex.Transaction, sessionId: number, channel: number | null, label: string | null, c: CalibrationWrite): Promise<number> {
	const id = await ensureChain(trx, sessionId, channel, label);
	await trx('input_chains').where({ id }).update({
		calibrator_object_key: c.objectKey,
		calibrator_filename: c.filename,
		calibrator_sha256: c.sha256,
		calibrator_size_bytes: c.sizeBytes,
		calibrator_channel: c.fileChannel,
		stated_level_db_spl: c.calibration.statedLevelDbSpl,
		tone_dbfs: c.calibration.toneDbfs,
		offset_db: c.calibration.offsetDb,
		calibration: JSON.stringify(c.calibration),
		calibrated_by: c.by,
		calibrated_at: new Date()
	});
	return id;
}

export interface CorrectionWrite {
	filename: string;
	points: CorrectionPoint[];
	comments: string[];
	sense: CorrectionSense;
	by: number | null;
}

export async function setCorrection(trx: Knex.Transaction, sessionId: number, channel: number | null, label: string | null, c: CorrectionWrite): Promise<number> {
	const id = await ensureChain(trx, sessionId, channel, label);
	await trx('input_chains').where({ id }).update({
		correction_filename: c.filename,
		correction_points: JSON.stringify(c.points),
		correction_comments: JSON.stringify(c.comments),
		correction_sense: c.sense,
		corrected_by: c.by,
		corrected_at: new Date()
	});
	return id;
}

const CALIBRATION_COLUMNS = [
	'calibrator_object_key', 'calibrator_filename', 'calibrator_sha256', 'calibrator_size_bytes', 'calibrator_channel',
	'stated_level_db_spl', 'tone_dbfs', 'offset_db', 'calibration', 'calibrated_by', 'calibrated_at'
];
const CORRECTION_COLUMNS = ['correction_filename', 'correction_points', 'correction_comments', 'correction_sense', 'corrected_by', 'corrected_at'];

/** Clear one half of a chain; a chain left with neither is deleted. */
export async function clearPart(trx: Knex.Transaction, chainId: number, part: 'calibration' | 'correction'): Promise<void> {
	const columns = part === 'calibration' ? CALIBRATION_COLUMNS : CORRECTION_COLUMNS;
	await trx('input_chains').where({ id: chainId }).update(Object.fromEntries(columns.map((c) => [c, null])));
	await trx('input_chains').where({ id: chainId }).whereNull('offset_db').whereNull('correction_points').del();
}

/** Settled captures of a visit a chain applies to: its channel's, or every channel's for a visit-wide chain. */
export async function captureIdsForChannel(k: Knex, sessionId: number, channel: number | null): Promise<number[]> {
	const q = k('captures').where({ session_id: sessionId });
	if (channel !== null) q.where({ channel });
	return (await q.select('id')).map((r) => r.id as number);
}

/** Store the levels an analysis was given, and whether they are dB SPL. */
export async function storeLevels(k: Knex, captureId: number, levels: CaptureLevels, chainId: number | null): Promise<void> {
	await k('analyses').where({ capture_id: captureId }).update({ levels: JSON.stringify(levels), levels_calibrated: levels.calibrated, input_chain_id: chainId });
}

export async function getLevels(k: Knex, captureId: number): Promise<CaptureLevels | null> {
	const r = await k('analyses').where({ capture_id: captureId }).first('levels');
	return r?.levels ? readJson<CaptureLevels>(r.levels) : null;
}

/** The latest analysed capture's levels of each position of a visit (as the results use). */
export async function levelsOfSession(k: Knex, sessionId: number): Promise<{ captureId: number; positionLabel: string; channel: number; levels: CaptureLevels | null }[]> {
	const rows = await k('captures as c')
		.join('positions as po', 'po.id', 'c.position_id')
		.join('analyses as a', 'a.capture_id', 'c.id')
		.where({ 'c.session_id': sessionId, 'c.status': 'analysed' })
		.orderBy('po.label')
		.orderBy('c.id', 'desc')
		.select('c.id', 'c.channel', 'po.label', 'a.levels');
	const seen = new Set<string>();
	const out: { captureId: number; positionLabel: string; channel: number; levels: CaptureLevels | null }[] = [];
	for (const r of rows) {
		if (seen.has(r.label)) continue;
		seen.add(r.label);
		out.push({ captureId: r.id, positionLabel: r.label, channel: r.channel, levels: r.levels ? readJson<CaptureLevels>(r.levels) : null });
	}
	return out;
}
