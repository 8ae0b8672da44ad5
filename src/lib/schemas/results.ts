import { z } from 'zod';

/** The 1/N-octave smoothings the engine stores with every response. */
export const SMOOTHINGS = ['1', '3', '6', '12', '24'] as const;

/** The query of a responses route: which smoothing, `?smoothing=3` for 1/3 octave. */
export const responsesQuerySchema = z.object({
	smoothing: z.enum(SMOOTHINGS, { error: 'Ask for smoothing=1, 3, 6, 12 or 24 (1/N octave).' }).meta({ description: '1/N-octave smoothing: 1, 3, 6, 12 or 24.' })
});

/** The query of a bands route: octave or one-third-octave bands. */
export const bandsQuerySchema = z.object({
	kind: z.enum(['octave', 'third'], { error: 'Ask for kind=octave or kind=third.' }).meta({ description: 'octave, or third for one-third-octave bands.' })
});
