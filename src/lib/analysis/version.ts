/**
 * Version of the analysis engine, stored with every result.
 * Bump rule: major when a stored number changes meaning or method (results no longer comparable
 * across versions: filters, start point, noise handling, definitions); minor when the result gains
 * fields or warnings without changing existing numbers; patch for fixes that change no stored
 * number beyond its rounding.
 */
// 2.0.0 (briefly stored as 1.1.0): broadband values from the span of the bands, reflections against
// the local diffuse level, a deconvolved sweep's low bands kept to the decay recorded after the
// sweep and one INR behind every gate changed stored numbers, so 1.x results are not comparable.
// 2.1.0: results may carry the 31.5 Hz and 16 kHz octaves (option extraOctaves) and one-third-octave
// bands beside the octaves (with-thirds.ts); no earlier number changes.
export const ENGINE_VERSION = '2.1.0';
