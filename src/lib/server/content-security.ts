// The Content-Security-Policy comes from `kit.csp` in svelte.config.js (SvelteKit adds the nonce of
// each page's own scripts). Object storage is a runtime setting, so the one source that depends on
// it — where the browser PUTs presigned uploads — is added per response.
import type { AppConfig } from './config';

/** The origin the browser uploads to: bucket in the path, or as a subdomain of the endpoint. */
export function storageOrigin(c: Pick<AppConfig, 'S3_ENDPOINT' | 'S3_PUBLIC_ENDPOINT' | 'S3_BUCKET' | 'S3_FORCE_PATH_STYLE'>): string {
	const url = new URL(c.S3_PUBLIC_ENDPOINT ?? c.S3_ENDPOINT);
	if (!c.S3_FORCE_PATH_STYLE) url.hostname = `${c.S3_BUCKET}.${url.hostname}`;
	return url.origin;
}

/** The policy with `sources` added to `directive` (which is created when absent). */
export function withSources(policy: string, directive: string, sources: string[]): string {
	const parts = policy
		.split(';')
		.map((p) => p.trim())
		.filter(Boolean);
	const i = parts.findIndex((p) => p.split(/\s+/)[0].toLowerCase() === directive);
	if (i === -1) return [...parts, [directive, ...sources].join(' ')].join('; ');
	const present = new Set(parts[i].split(/\s+/).slice(1));
	parts[i] = [parts[i], ...sources.filter((s) => !present.has(s))].join(' ');
	return parts.join('; ');
}
