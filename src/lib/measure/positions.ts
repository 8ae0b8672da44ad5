// Moving on from one position to the next, and the names measured files get.

/** The label after this one: the number at its end plus one (P3 → P4, "Seat 9" → "Seat 10"); a label without one gets " 2". */
export function nextPositionLabel(current: string): string {
	const trimmed = current.trim();
	const m = trimmed.match(/^(.*?)(\d+)$/);
	if (!m) return `${trimmed || 'P'} 2`;
	return `${m[1]}${Number(m[2]) + 1}`;
}

/** The first label of the form P1, P2, … that no position of the visit has. */
export function firstFreeLabel(taken: readonly string[]): string {
	const set = new Set(taken);
	let n = 1;
	while (set.has(`P${n}`)) n++;
	return `P${n}`;
}

const pad = (n: number) => String(n).padStart(2, '0');

/** The file name of a take: the position, how many repetitions, and when (local time). */
export function takeFilename(positionLabel: string, repetitions: number, at: Date): string {
	const safe = positionLabel.trim().replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'position';
	const stamp = `${at.getFullYear()}${pad(at.getMonth() + 1)}${pad(at.getDate())}-${pad(at.getHours())}${pad(at.getMinutes())}${pad(at.getSeconds())}`;
	return `${safe}-measured-${repetitions}x-${stamp}.wav`;
}
