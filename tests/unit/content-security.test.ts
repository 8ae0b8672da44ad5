import { describe, expect, it } from 'vitest';
import { storageOrigin, withSources } from '../../src/lib/server/content-security';

const store = { S3_ENDPOINT: 'http://127.0.0.1:4569', S3_PUBLIC_ENDPOINT: undefined, S3_BUCKET: 'recordings', S3_FORCE_PATH_STYLE: true };

describe('storageOrigin', () => {
	it('is the endpoint itself when the bucket is in the path', () => {
		expect(storageOrigin(store)).toBe('http://127.0.0.1:4569');
	});

	it('is the public endpoint when the browser reaches storage elsewhere', () => {
		expect(storageOrigin({ ...store, S3_PUBLIC_ENDPOINT: 'https://s3.example.com/' })).toBe('https://s3.example.com');
	});

	it('puts the bucket in front of the host for virtual-host style addresses', () => {
		expect(storageOrigin({ ...store, S3_PUBLIC_ENDPOINT: 'https://s3.eu-central-1.example.com:8443', S3_FORCE_PATH_STYLE: false })).toBe(
			'https://recordings.s3.eu-central-1.example.com:8443'
		);
	});
});

describe('withSources', () => {
	const policy = "default-src 'self'; connect-src 'self'; frame-ancestors 'none'";

	it('adds sources to the named directive only', () => {
		expect(withSources(policy, 'connect-src', ['http://127.0.0.1:4569'])).toBe("default-src 'self'; connect-src 'self' http://127.0.0.1:4569; frame-ancestors 'none'");
	});

	it('does not repeat a source already there', () => {
		expect(withSources("connect-src 'self' https://s3.example.com", 'connect-src', ['https://s3.example.com'])).toBe("connect-src 'self' https://s3.example.com");
	});

	it('adds the directive when the policy lacks it', () => {
		expect(withSources("default-src 'self';", 'connect-src', ["'self'", 'https://s3.example.com'])).toBe("default-src 'self'; connect-src 'self' https://s3.example.com");
	});
});
