// Object storage through the AWS SDK only, so any S3-compatible service is a configuration change.
import {
	AbortMultipartUploadCommand,
	DeleteObjectCommand,
	HeadBucketCommand,
	GetObjectCommand,
	HeadObjectCommand,
	ListObjectsV2Command,
	PutObjectCommand,
	S3Client,
	type PutObjectCommandInput
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { Upload } from '@aws-sdk/lib-storage';
import type { Readable } from 'node:stream';
import { randomUUID } from 'node:crypto';
import { config, type AppConfig } from './config';
import { Problem, unavailable } from './problem';

const STORAGE_DOWN = 'Object storage is not reachable right now. Try again in a moment.';

function client(c: AppConfig, endpoint: string): S3Client {
	return new S3Client({
		endpoint,
		region: c.S3_REGION,
		forcePathStyle: c.S3_FORCE_PATH_STYLE,
		credentials: { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY },
		// With the SDK defaults a streamed upload was stored with chunk framing inside the object.
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED',
		maxAttempts: 2,
		// Without these a store that accepts the connection and then says nothing (paused, or
		// overloaded) held each request for as long as the caller waited.
		requestHandler: {
			connectionTimeout: c.S3_CONNECT_TIMEOUT_MS,
			socketTimeout: c.S3_IDLE_TIMEOUT_MS,
			requestTimeout: c.S3_REQUEST_TIMEOUT_MS,
			throwOnRequestTimeout: true
		}
	});
}

export interface Storage {
	bucket: string;
	/** Throws a 503 problem when the store cannot be reached. */
	ping(): Promise<void>;
	presignPut(key: string, contentType: string, contentLength: number, expiresInS?: number): Promise<string>;
	presignGet(key: string, downloadName: string, expiresInS?: number): Promise<string>;
	head(key: string): Promise<{ size: number; contentType: string | undefined } | null>;
	getBytes(key: string, range?: { start: number; end: number }): Promise<Uint8Array>;
	put(key: string, body: PutObjectCommandInput['Body'], contentType: string, contentLength?: number): Promise<void>;
	/**
	 * Store a stream of unknown length as it arrives (S3 multipart upload, parts of
	 * UPLOAD_PART_BYTES, at most UPLOAD_PARTS_IN_FLIGHT held at once). When the stream fails,
	 * the upload is dropped and the stream's own error is thrown; nothing is stored.
	 */
	upload(key: string, body: Readable, contentType: string): Promise<void>;
	remove(key: string): Promise<void>;
	/** The objects under a prefix, a page at a time (`after` is the previous page's `next`). */
	list(prefix: string, after?: string): Promise<{ objects: { key: string; lastModified: Date }[]; next: string | undefined }>;
}

/** S3's smallest part (all but the last): what a streamed upload holds per part in memory. */
export const UPLOAD_PART_BYTES = 5 * 1024 * 1024;
/** Parts of one streamed upload sent at once; the stream waits while they are all in flight. */
const UPLOAD_PARTS_IN_FLIGHT = 2;

const isNotFound = (e: unknown) => {
	const x = e as { name?: string; $metadata?: { httpStatusCode?: number } };
	return x?.name === 'NotFound' || x?.name === 'NoSuchKey' || x?.$metadata?.httpStatusCode === 404;
};

/**
 * The one place storage failures are mapped: the store not answering (refused, reset, timed out,
 * or answering 5xx after the SDK's retry) becomes a 503 problem, which API routes, form actions
 * and pages all answer as "briefly unavailable"; other S3 answers (404, 403…) pass through.
 */
async function guard<T>(work: () => Promise<T>): Promise<T> {
	try {
		return await work();
	} catch (e) {
		if (e instanceof Problem) throw e;
		const status = (e as { $metadata?: { httpStatusCode?: number } })?.$metadata?.httpStatusCode;
		if (status !== undefined && status < 500) throw e;
		throw unavailable(STORAGE_DOWN, e);
	}
}

export function createStorage(c: AppConfig = config()): Storage {
	const s3 = client(c, c.S3_ENDPOINT);
	const publicS3 = c.S3_PUBLIC_ENDPOINT ? client(c, c.S3_PUBLIC_ENDPOINT) : s3;
	const Bucket = c.S3_BUCKET;
	return {
		bucket: Bucket,
		async ping() {
			await guard(() => s3.send(new HeadBucketCommand({ Bucket })));
		},
		presignPut(key, contentType, contentLength, expiresInS = 900) {
			// Content type and length are signed: the store refuses a PUT that differs.
			return getSignedUrl(publicS3, new PutObjectCommand({ Bucket, Key: key, ContentType: contentType, ContentLength: contentLength }), {
				expiresIn: expiresInS,
				signableHeaders: new Set(['content-type', 'content-length'])
			});
		},
		presignGet(key, downloadName, expiresInS = 300) {
			const safe = downloadName.replace(/[^\w.\- ]+/g, '_');
			return getSignedUrl(publicS3, new GetObjectCommand({ Bucket, Key: key, ResponseContentDisposition: `attachment; filename="${safe}"` }), {
				expiresIn: expiresInS
			});
		},
		async head(key) {
			try {
				const r = await guard(() => s3.send(new HeadObjectCommand({ Bucket, Key: key })));
				return { size: Number(r.ContentLength ?? 0), contentType: r.ContentType };
			} catch (e) {
				if (isNotFound(e)) return null;
				throw e;
			}
		},
		async getBytes(key, range) {
			// The body is read inside the guard too: a store can stall after the headers.
			return guard(async () => {
				const r = await s3.send(new GetObjectCommand({ Bucket, Key: key, Range: range ? `bytes=${range.start}-${range.end}` : undefined }));
				return new Uint8Array(await r.Body!.transformToByteArray());
			});
		},
		async put(key, body, contentType, contentLength) {
			await guard(() => s3.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType, ContentLength: contentLength })));
		},
		async upload(key, body, contentType) {
			let bodyError: unknown = null;
			body.once('error', (e) => (bodyError ??= e));
			// A body that fits one part is stored with one PUT; a longer one as a multipart upload.
			// Its parts are dropped here (not by the library, whose own clean-up error would hide
			// the cause); a lifecycle rule on the bucket is the backstop for a server that dies.
			const upload = new Upload({
				client: s3,
				params: { Bucket, Key: key, Body: body, ContentType: contentType },
				partSize: UPLOAD_PART_BYTES,
				queueSize: UPLOAD_PARTS_IN_FLIGHT,
				leavePartsOnError: true
			});
			try {
				await guard(() => upload.done());
			} catch (e) {
				if (upload.uploadId) await s3.send(new AbortMultipartUploadCommand({ Bucket, Key: key, UploadId: upload.uploadId })).catch(() => {});
				throw bodyError ?? e;
			}
		},
		async remove(key) {
			await guard(() => s3.send(new DeleteObjectCommand({ Bucket, Key: key })));
		},
		async list(prefix, after) {
			const r = await guard(() => s3.send(new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken: after })));
			return {
				objects: (r.Contents ?? []).filter((o) => o.Key).map((o) => ({ key: o.Key!, lastModified: o.LastModified ?? new Date() })),
				next: r.IsTruncated ? r.NextContinuationToken : undefined
			};
		}
	};
}

let shared: Storage | undefined;
export function storage(): Storage {
	shared ??= createStorage();
	return shared;
}

/** Object keys are random, so knowing one capture's key tells nothing about another's. */
export function newObjectKey(prefix: 'captures' | 'references' | 'sweeps' | 'reports' | 'calibrators'): string {
	return `${prefix}/${randomUUID()}.${prefix === 'reports' ? 'pdf' : 'wav'}`;
}
