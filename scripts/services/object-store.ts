/// <reference path="./s3rver.d.ts" />
// The local S3-compatible fake (s3rver) on 127.0.0.1. The app only ever talks to it through
// @aws-sdk/client-s3, so a real S3-compatible service is a configuration change.
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';
import type { RunningService } from './mariadb';

export interface ObjectStoreOptions {
	dir: string;
	port: number;
	bucket: string;
}

// Browsers PUT straight to the bucket with presigned URLs, so it needs a CORS rule.
const corsXml = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>POST</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`;

export async function startObjectStore(o: ObjectStoreOptions): Promise<RunningService> {
	mkdirSync(o.dir, { recursive: true });
	const server = new S3rver({
		port: o.port,
		address: '127.0.0.1',
		directory: o.dir,
		silent: true,
		configureBuckets: [{ name: o.bucket, configs: [corsXml] }]
	});
	await server.run();
	return {
		name: 's3rver',
		async stop() {
			await server.close();
		}
	};
}
