// Browser-side calls to our JSON routes: one place that turns error answers into messages.
// A refusal answers { message, code?, errors?: { [field]: reason }, ...details }.
export class ApiFailure extends Error {
	constructor(
		readonly status: number,
		message: string,
		readonly body: Record<string, unknown>
	) {
		super(message);
	}

	/** The message and, after it, each field's own reason that says more than the message. */
	get detail(): string {
		const fields = Object.values((this.body.errors as Record<string, string> | undefined) ?? {}).filter((m) => m !== this.message);
		return [this.message, ...fields].join(' ');
	}
}

export async function apiFetch<T>(url: string, init: RequestInit = {}): Promise<T> {
	const res = await fetch(url, { ...init, headers: { accept: 'application/json', ...(init.body ? { 'content-type': 'application/json' } : {}), ...init.headers } });
	if (res.status === 204) return undefined as T;
	const body = (await res.json().catch(() => ({}))) as Record<string, unknown>;
	if (!res.ok) throw new ApiFailure(res.status, String(body.message ?? `The server answered ${res.status}.`), body);
	return body as T;
}

/** SHA-256 of a file, hex — so the server can spot a file already in the visit before it is sent. */
export async function sha256Hex(file: Blob): Promise<string> {
	const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
	return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

/** PUT a file to a presigned URL with progress (fetch cannot report upload progress). */
export function putWithProgress(url: string, file: Blob, headers: Record<string, string>, onProgress: (fraction: number) => void): Promise<void> {
	return new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('PUT', url);
		for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
		xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
		xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? (onProgress(1), resolve()) : reject(new Error(`Storage refused the upload (${xhr.status}).`)));
		xhr.onerror = () => reject(new Error('The upload to storage failed: check the connection and try again.'));
		xhr.send(file);
	});
}
