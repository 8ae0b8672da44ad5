// fontkit (pdfkit's font reader) ships no types; the report tests use it as an independent reader of fonts.
declare module 'fontkit' {
	export function create(buffer: Uint8Array): unknown;
}
