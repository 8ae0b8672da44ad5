// A part cut from sheet goods, shared by the build sheets and the cut list.

/** Grain runs along the part's length, along its width, or does not matter (MDF, hidden parts). */
export type Grain = 'along-length' | 'along-width' | 'none';

/** Faces that must be clean: 2 for a part seen from both sides, 1 for one, 0 for hidden parts. */
export type FinishedFaces = 0 | 1 | 2;

export interface Part {
	name: string;
	quantity: number;
	lengthMm: number;
	widthMm: number;
	thicknessMm: number;
	finishedFaces: FinishedFaces;
	grain: Grain;
	note?: string;
	/** Face area of a shaped part (a cap cut to the well profile) when smaller than its blank, mm². */
	areaMm2?: number;
}

export function checkPart(part: Part): void {
	const where = `part "${part.name}"`;
	if (!(Number.isInteger(part.quantity) && part.quantity >= 1)) throw new Error(`${where}: quantity must be a whole number ≥ 1, got ${part.quantity}`);
	for (const key of ['lengthMm', 'widthMm', 'thicknessMm'] as const) {
		const v = part[key];
		if (!(Number.isFinite(v) && v > 0)) throw new Error(`${where}: ${key} must be a positive number of mm, got ${v}`);
	}
	if (![0, 1, 2].includes(part.finishedFaces)) throw new Error(`${where}: finishedFaces must be 0, 1 or 2`);
	if (!['along-length', 'along-width', 'none'].includes(part.grain)) throw new Error(`${where}: unknown grain "${String(part.grain)}"`);
}

/** Merges parts that are the same in every respect, summing their quantities. */
export function mergeIdenticalParts(parts: readonly Part[]): Part[] {
	const out: Part[] = [];
	for (const p of parts) {
		const twin = out.find(
			(q) =>
				q.name === p.name &&
				q.lengthMm === p.lengthMm &&
				q.widthMm === p.widthMm &&
				q.thicknessMm === p.thicknessMm &&
				q.finishedFaces === p.finishedFaces &&
				q.grain === p.grain &&
				q.note === p.note
		);
		if (twin) twin.quantity += p.quantity;
		else out.push({ ...p });
	}
	return out;
}
