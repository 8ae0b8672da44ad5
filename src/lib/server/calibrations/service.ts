// Input chains of a visit: the SPL calibration from a calibrator recording, the microphone
// correction file, and what a change means for the captures already analysed (they run again).
// The calibrator recording is kept in object storage next to the captures; a replaced or removed
// one is deleted after the change is committed, a refused one never stays.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { alignBandLevels, type AlignedLevels } from '../../analysis/level-alignment';
import { calibrateFromCalibrator, isCalibrationError, type ChainCalibration } from '../../analysis/calibration';
import { isMicCorrectionError, parseMicCorrection } from '../../analysis/mic-correction';
import { decodeWav, isAnalysisInputError } from '../../analysis';
import { CALIBRATOR_MAX_BYTES, CORRECTION_MAX_BYTES, type CalibrateInput, type CorrectionInput } from '../../schemas/calibrations';
import { audit } from '../audit';
import { db } from '../db';
import { enqueue } from '../jobs/queue';
import { invalid, notFound, Problem } from '../problem';
import { newObjectKey, storage, type Storage } from '../storage';
import { transaction } from '../transaction';
import { requeueSettled } from '../queries/captures';
import * as chains from '../queries/calibrations';
import type { Scope } from '../auth/access';

export interface UploadedFile {
	name: string;
	bytes: Uint8Array;
}

/** A form's file field as bytes, or null when none was chosen. */
export async function fileOf(formData: FormData, field = 'file'): Promise<UploadedFile | null> {
	const value = formData.get(field);
	if (!value || typeof value === 'string' || value.size === 0) return null;
	return { name: value.name || 'upload', bytes: new Uint8Array(await value.arrayBuffer()) };
}

/** Longest calibrator recording read (a calibrator needs a few seconds; common practice, no source). */
const CALIBRATOR_MAX_DURATION_S = 60;

const channelName = (channel: number | null) => (channel === null ? 'every channel' : `channel ${channel}`);

/** Queue the analysis of the visit's settled captures the chain applies to; how many. */
async function requeueFor(trx: Knex.Transaction, sessionId: number, channel: number | null): Promise<number> {
	let queued = 0;
	for (const id of await chains.captureIdsForChannel(trx, sessionId, channel)) {
		if (await requeueSettled(trx, id)) {
			await enqueue(trx, 'analyse-capture', { captureId: id });
			queued++;
		}
	}
	return queued;
}

async function removeObjectAfterCommit(s: Storage, key: string | null | undefined): Promise<void> {
	if (!key) return;
	try {
		await s.remove(key);
	} catch (e) {
		// The change is committed; a stale object is only storage, never read again.
		console.error(`calibrator recording ${key} could not be removed:`, e);
	}
}

/** Read the calibrator recording and work out the chain's offset; refusals name the problem. */
export function readCalibrator(file: UploadedFile | null, input: Pick<CalibrateInput, 'statedLevelDbSpl' | 'fileChannel'>): ChainCalibration {
	if (!file) throw invalid('Choose the calibrator recording (a WAV file).', 'file');
	if (!/\.wave?$/i.test(file.name)) throw invalid('The calibrator recording must be a WAV file (.wav).', 'file');
	if (file.bytes.length > CALIBRATOR_MAX_BYTES) {
		throw new Problem(413, `The calibrator recording is larger than ${Math.round(CALIBRATOR_MAX_BYTES / 1000)} kB: a few seconds of one channel is enough.`, { field: 'file' });
	}
	let decoded;
	try {
		decoded = decodeWav(file.bytes, { channel: input.fileChannel, maxDurationS: CALIBRATOR_MAX_DURATION_S });
	} catch (e) {
		if (isAnalysisInputError(e)) throw new Problem(422, `The calibrator recording cannot be read: ${e.message}.`, { field: 'file', code: e.code });
		throw e;
	}
	try {
		return calibrateFromCalibrator(decoded.samples, decoded.sampleRate, input.statedLevelDbSpl);
	} catch (e) {
		if (isCalibrationError(e)) throw new Problem(422, `No calibration from this recording: ${e.message}.`, { field: 'file', code: e.code });
		throw e;
	}
}

/** Calibrate a chain of the visit from a calibrator recording; its captures are analysed again. */
export async function calibrate(scope: Scope, sessionId: number, input: CalibrateInput, file: UploadedFile | null, s: Storage = storage()): Promise<{ chainId: number; offsetDb: number; queued: number }> {
	const calibration = readCalibrator(file, input);
	const bytes = file!.bytes;
	await s.ping();
	const objectKey = newObjectKey('calibrators');
	await s.put(objectKey, bytes, 'audio/wav', bytes.length);
	let replaced: string | null = null;
	try {
		const sha256 = createHash('sha256').update(bytes).digest('hex');
		const result = await transaction(async (trx) => {
			await chains.lockSession(trx, sessionId);
			replaced = (await chains.getChain(trx, sessionId, input.channel, true))?.calibration?.objectKey ?? null;
			const chainId = await chains.setCalibration(trx, sessionId, input.channel, input.label, {
				objectKey,
				filename: file!.name,
				sha256,
				sizeBytes: bytes.length,
				fileChannel: input.fileChannel,
				calibration,
				by: scope.user.id
			});
			const queued = await requeueFor(trx, sessionId, input.channel);
			await audit(trx, scope, 'calibration.set', 'input_chain', chainId, {
				sessionId,
				channel: input.channel,
				filename: file!.name,
				statedLevelDbSpl: calibration.statedLevelDbSpl,
				toneDbfs: calibration.toneDbfs,
				offsetDb: calibration.offsetDb,
				replaced: replaced !== null,
				queued
			});
			return { chainId, offsetDb: calibration.offsetDb, queued };
		});
		await removeObjectAfterCommit(s, replaced);
		return result;
	} catch (e) {
		await removeObjectAfterCommit(s, objectKey);
		throw e;
	}
}

/** Read a correction file; a malformed one is refused with its line number. */
export function readCorrection(file: UploadedFile | null) {
	if (!file) throw invalid('Choose the microphone correction file (plain text).', 'file');
	if (file.bytes.length > CORRECTION_MAX_BYTES) throw new Problem(413, `The correction file is larger than ${CORRECTION_MAX_BYTES / 1024} kB.`, { field: 'file' });
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(file.bytes);
	} catch {
		throw invalid('The correction file is not plain text (UTF-8).', 'file', { code: 'malformed_correction' });
	}
	try {
		return parseMicCorrection(text);
	} catch (e) {
		if (isMicCorrectionError(e)) {
			const where = e.line === null ? 'The correction file' : `Line ${e.line} of the correction file`;
			const what = e.line === null ? e.message : e.message.replace(/^line \d+: /, '');
			throw invalid(`${where}: ${what}.`, 'file', { code: 'malformed_correction', details: { line: e.line } });
		}
		throw e;
	}
}

/** Upload or replace a chain's microphone correction; its captures are analysed again. */
export async function setCorrection(scope: Scope, sessionId: number, input: CorrectionInput, file: UploadedFile | null): Promise<{ chainId: number; points: number; queued: number }> {
	const parsed = readCorrection(file);
	return transaction(async (trx) => {
		await chains.lockSession(trx, sessionId);
		const replaced = Boolean((await chains.getChain(trx, sessionId, input.channel, true))?.correction);
		const chainId = await chains.setCorrection(trx, sessionId, input.channel, input.label, {
			filename: file!.name,
			points: parsed.points,
			comments: parsed.comments.slice(0, 20).map((c) => c.slice(0, 200)),
			sense: input.sense,
			by: scope.user.id
		});
		const queued = await requeueFor(trx, sessionId, input.channel);
		await audit(trx, scope, 'correction.set', 'input_chain', chainId, { sessionId, channel: input.channel, filename: file!.name, points: parsed.points.length, sense: input.sense, replaced, queued });
		return { chainId, points: parsed.points.length, queued };
	});
}

/** Remove a chain's calibration or correction; its captures are analysed again. */
export async function removePart(scope: Scope, sessionId: number, channel: number | null, part: 'calibration' | 'correction', s: Storage = storage()): Promise<{ queued: number }> {
	let objectKey: string | null = null;
	const result = await transaction(async (trx) => {
		await chains.lockSession(trx, sessionId);
		const chain = await chains.getChain(trx, sessionId, channel, true);
		if (!chain || !chain[part]) throw notFound(`There is no ${part === 'calibration' ? 'calibration' : 'microphone correction'} for ${channelName(channel)} of this visit.`);
		objectKey = part === 'calibration' ? (chain.calibration?.objectKey ?? null) : null;
		await chains.clearPart(trx, chain.id, part);
		const queued = await requeueFor(trx, sessionId, channel);
		await audit(trx, scope, part === 'calibration' ? 'calibration.removed' : 'correction.removed', 'input_chain', chain.id, { sessionId, channel, queued });
		return { queued };
	});
	await removeObjectAfterCommit(s, objectKey);
	return result;
}

/** A chain as pages show it (no object keys). */
export interface ChainView {
	channel: number | null;
	channelName: string;
	label: string | null;
	calibration: { filename: string; statedLevelDbSpl: number; toneDbfs: number; offsetDb: number; toneFrequencyHz: number; levelSpreadDb: number; steadyS: number; byName: string | null; at: string } | null;
	correction: { filename: string; points: number; lowHz: number; highHz: number; sense: 'deviation' | 'correction'; comments: string[]; byName: string | null; at: string } | null;
}

function chainView(c: chains.InputChainRow): ChainView {
	return {
		channel: c.channel,
		channelName: channelName(c.channel),
		label: c.label,
		calibration: c.calibration && {
			filename: c.calibration.filename,
			statedLevelDbSpl: c.calibration.statedLevelDbSpl,
			toneDbfs: c.calibration.toneDbfs,
			offsetDb: c.calibration.offsetDb,
			toneFrequencyHz: c.calibration.details.toneFrequencyHz,
			levelSpreadDb: c.calibration.details.levelSpreadDb,
			steadyS: c.calibration.details.steady.durationS,
			byName: c.calibration.byName,
			at: new Date(c.calibration.at).toISOString()
		},
		correction: c.correction && {
			filename: c.correction.filename,
			points: c.correction.points.length,
			lowHz: c.correction.points[0].freqHz,
			highHz: c.correction.points[c.correction.points.length - 1].freqHz,
			sense: c.correction.sense,
			comments: c.correction.comments,
			byName: c.correction.byName,
			at: new Date(c.correction.at).toISOString()
		}
	};
}

/** Per position, the band levels as the alignment takes them (dBFS, and the chain's offset when calibrated). */
export interface PositionLevels {
	positionLabel: string;
	captureId: number;
	channel: number;
	bands: { centerHz: number; levelDb: number | null }[];
	calibrationOffsetDb: number | null;
	corrected: boolean;
}

/** The calibration state of a visit: its chains, each position's levels and their average. */
export async function calibrationSummary(sessionId: number, k: Knex = db()) {
	const [rows, levels] = await Promise.all([chains.listChains(k, sessionId), chains.levelsOfSession(k, sessionId)]);
	const positions: PositionLevels[] = [];
	const withoutLevels: string[] = [];
	for (const p of levels) {
		if (!p.levels) {
			withoutLevels.push(p.positionLabel);
			continue;
		}
		const offset = p.levels.offsetDb;
		positions.push({
			positionLabel: p.positionLabel,
			captureId: p.captureId,
			channel: p.channel,
			// Back to dBFS (correction kept): the alignment adds the offset itself when every position has one.
			bands: p.levels.bands.map((b) => ({ centerHz: b.centerHz, levelDb: b.levelDb === null ? null : b.levelDb - (offset ?? 0) })),
			calibrationOffsetDb: offset,
			corrected: p.levels.correction !== null
		});
	}
	const average: AlignedLevels = alignBandLevels(positions);
	return { chains: rows.map(chainView), positions, withoutLevels, average };
}

export type CalibrationSummary = Awaited<ReturnType<typeof calibrationSummary>>;

/** The calibration page: the visit's chains and the channels its captures use. */
export async function calibrationPage(sessionId: number) {
	const k = db();
	const summary = await calibrationSummary(sessionId, k);
	const channels = (await k('captures').where({ session_id: sessionId }).distinct('channel').orderBy('channel')).map((r) => r.channel as number);
	return { ...summary, channels };
}

/** A capture's stored levels (its chain's offset and correction), null before levels were stored. */
export async function captureLevels(captureId: number) {
	return chains.getLevels(db(), captureId);
}
