/** Why an input (a file, a signal, an option) cannot be analysed; `code` is stable, `message` is for people. */
export type AnalysisInputErrorCode =
	| 'not_riff_wave'
	| 'header_truncated'
	| 'missing_chunk'
	| 'data_truncated'
	| 'unsupported_format'
	| 'unsupported_bit_depth'
	| 'unsupported_sample_rate'
	| 'unsupported_channel_count'
	| 'channel_out_of_range'
	| 'no_samples'
	| 'non_finite_samples'
	| 'too_long'
	| 'too_short'
	| 'silent_signal'
	| 'sample_rate_mismatch'
	| 'sweep_not_recorded'
	| 'invalid_option';

export class AnalysisInputError extends Error {
	readonly code: AnalysisInputErrorCode;

	constructor(code: AnalysisInputErrorCode, message: string) {
		super(message);
		this.name = 'AnalysisInputError';
		this.code = code;
	}
}

export function isAnalysisInputError(value: unknown): value is AnalysisInputError {
	return value instanceof AnalysisInputError;
}
