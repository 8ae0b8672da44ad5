// Small bounded caches of what the results pages compute from stored analyses. Every key names
// the analysis rows it was made from (their id, time and engine version): a re-analysis replaces
// the row (a new id), so an entry is never stale, only unused, and the oldest unused ones go first.
// Cached values are frozen, so a caller that tried to change one would fail loudly instead of
// changing what the next request sees.

export class Lru<V> {
	private readonly entries = new Map<string, V>();
	constructor(readonly capacity: number) {
		if (!Number.isInteger(capacity) || capacity < 1) throw new RangeError(`capacity must be a positive integer, got ${capacity}`);
	}

	get size(): number {
		return this.entries.size;
	}

	get(key: string): V | undefined {
		const value = this.entries.get(key);
		if (value === undefined) return undefined;
		// Most recently used last.
		this.entries.delete(key);
		this.entries.set(key, value);
		return value;
	}

	set(key: string, value: V): V {
		this.entries.delete(key);
		this.entries.set(key, value);
		while (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
		return value;
	}

	/** The cached value, or the one `make` gives (then kept, frozen). */
	async through(key: string, make: () => Promise<V> | V): Promise<V> {
		const hit = this.get(key);
		if (hit !== undefined) return hit;
		return this.set(key, deepFreeze(await make()));
	}

	clear(): void {
		this.entries.clear();
	}
}

export function deepFreeze<T>(value: T): T {
	if (value === null || typeof value !== 'object' || Object.isFrozen(value)) return value;
	Object.freeze(value);
	if (Array.isArray(value)) {
		// Curves are long arrays of numbers: nothing inside to freeze.
		if (value.length > 0 && typeof value[0] === 'number') return value;
		for (const v of value) deepFreeze(v);
	} else for (const v of Object.values(value)) deepFreeze(v);
	return value;
}
