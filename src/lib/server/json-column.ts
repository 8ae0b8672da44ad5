// MariaDB's JSON columns are LONGTEXT underneath: mysql2 hands them back as strings, while a
// value built in this process may already be parsed. One reader for both.
export function readJson<T = unknown>(value: unknown): T {
	return (typeof value === 'string' ? JSON.parse(value) : value) as T;
}
