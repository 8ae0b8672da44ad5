/**
 * Version of the analysis engine, stored with every result.
 * Bump rule: major when a stored number changes meaning or method (results no longer comparable
 * across versions: filters, start point, noise handling, definitions); minor when the result gains
 * fields or warnings without changing existing numbers; patch for fixes that change no stored
 * number beyond its rounding.
 */
export const ENGINE_VERSION = '1.1.0';
