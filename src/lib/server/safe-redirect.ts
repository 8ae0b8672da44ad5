/** Only same-site paths may be redirect targets (no open redirects). */
export function safeRedirectPath(target: string | null | undefined, fallback = '/projects'): string {
	if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
	return target;
}
