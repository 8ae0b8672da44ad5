// The worker's step after the engine: the capture's levels through the input chain it was
// recorded with (calibration offset, microphone correction), stored with the analysis. Read in
// the transaction that writes the result, so a chain changed while the engine ran is the one used.
import type { Knex } from 'knex';
import { captureLevels } from '../../analysis/input-chain';
import type { AnalysisResult } from '../../analysis/types';
import { chainForCapture, chainLevels, storeLevels } from '../queries/calibrations';

export async function storeCaptureLevels(trx: Knex.Transaction, capture: { id: number; sessionId: number; channel: number }, result: AnalysisResult): Promise<void> {
	const chain = await chainForCapture(trx, capture.sessionId, capture.channel);
	const levels = captureLevels(result, chainLevels(chain));
	await storeLevels(trx, capture.id, levels, levels.calibrated || levels.correction ? chain!.id : null);
}
