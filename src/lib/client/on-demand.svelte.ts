// A choice on a results page (a smoothing, a band kind) whose data the page was not sent for every
// option: the first option's comes with the page, another's is fetched the first time it is chosen
// and kept for that state of the results (their entity tag), so choosing it again, or the page's
// data coming back unchanged after a form, fetches nothing. While it loads, the last option in
// hand stays drawn.
import { apiFetch } from './api';

export interface OnDemandSource<K extends string, V> {
	/** The option whose data came with the page. */
	first: K;
	/** That data; read reactively, so a page data update is followed. */
	firstValue: () => V;
	/** The tag of the results the page data came from: a new one drops what was fetched before. */
	tag: () => string;
	/** Where the data of another option is fetched from (a JSON route). */
	url: (key: K) => string;
}

export class OnDemand<K extends string, V> {
	/** The option chosen (a picker binds to it, through choose). */
	chosen = $state() as K;
	#last = $state() as K;
	#held = $state.raw(new Map<string, V>());
	#failed = $state.raw(new Map<string, string>());
	#pending = new Set<string>();
	private readonly source: OnDemandSource<K, V>;

	constructor(source: OnDemandSource<K, V>) {
		this.source = source;
		this.chosen = source.first;
		this.#last = source.first;
	}

	/** The data of an option, when it is in hand. */
	valueOf(key: K): V | undefined {
		return key === this.source.first ? this.source.firstValue() : this.#held.get(`${this.source.tag()} ${key}`);
	}

	/** The option drawn: the chosen one once its data is in hand, else the last one drawn, else the first. */
	get shown(): K {
		if (this.valueOf(this.chosen) !== undefined) return this.chosen;
		return this.valueOf(this.#last) !== undefined ? this.#last : this.source.first;
	}

	/** The data drawn. */
	get value(): V {
		return this.valueOf(this.shown)!;
	}

	get loading(): boolean {
		return this.shown !== this.chosen && this.error === null;
	}

	/** Why the chosen option's data could not be fetched, if it could not. */
	get error(): string | null {
		return this.#failed.get(`${this.source.tag()} ${this.chosen}`) ?? null;
	}

	/** Fetch the chosen option's data when it is not in hand; run it in an effect, so it follows the choice and the page data. */
	fetchChosen(): void {
		const key = this.chosen;
		const id = `${this.source.tag()} ${key}`;
		if (this.valueOf(key) !== undefined) {
			this.#last = key;
			return;
		}
		if (this.#pending.has(id) || this.#failed.has(id)) return;
		this.#pending.add(id);
		apiFetch<V>(this.source.url(key))
			.then((value) => (this.#held = new Map(this.#held).set(id, value)))
			.catch((e: unknown) => (this.#failed = new Map(this.#failed).set(id, e instanceof Error ? e.message : String(e))))
			.finally(() => this.#pending.delete(id));
	}

	/** Choose an option (again): a failed fetch of it is tried once more. */
	choose(key: K): void {
		const id = `${this.source.tag()} ${key}`;
		if (this.#failed.has(id)) {
			const failed = new Map(this.#failed);
			failed.delete(id);
			this.#failed = failed;
		}
		this.chosen = key;
	}
}
