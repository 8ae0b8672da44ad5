// Schroeder diffusers: quadratic-residue and primitive-root well sequences and the panel design.
import { formatHz } from '../format';
import { DEFAULT_SPEED_OF_SOUND } from './air';

export type DiffuserKind = 'quadratic-residue' | 'primitive-root';

export function isPrime(n: number): boolean {
	if (!Number.isInteger(n) || n < 2) return false;
	for (let d = 2; d * d <= n; d++) if (n % d === 0) return false;
	return true;
}

/** (base^exp) mod m without overflow for the small primes used here. */
function powMod(base: number, exp: number, m: number): number {
	let result = 1;
	let b = base % m;
	let e = exp;
	while (e > 0) {
		if (e & 1) result = (result * b) % m;
		b = (b * b) % m;
		e >>= 1;
	}
	return result;
}

function primeFactors(n: number): number[] {
	const out: number[] = [];
	let rest = n;
	for (let d = 2; d * d <= rest; d++) {
		if (rest % d === 0) {
			out.push(d);
			while (rest % d === 0) rest /= d;
		}
	}
	if (rest > 1) out.push(rest);
	return out;
}

/** g is a primitive root of prime N when g^((N−1)/q) ≠ 1 mod N for every prime factor q of N−1. */
export function isPrimitiveRoot(g: number, prime: number): boolean {
	if (!isPrime(prime) || !Number.isInteger(g) || g <= 0 || g % prime === 0) return false;
	return primeFactors(prime - 1).every((q) => powMod(g, (prime - 1) / q, prime) !== 1);
}

export function smallestPrimitiveRoot(prime: number): number {
	if (!isPrime(prime)) throw new Error(`${prime} is not a prime; primitive roots are defined here for prime N only`);
	if (prime === 2) return 1;
	for (let g = 2; g < prime; g++) if (isPrimitiveRoot(g, prime)) return g;
	throw new Error(`no primitive root found for ${prime}`);
}

const MAX_PRIME = 199;

function checkPrime(prime: number): void {
	if (!isPrime(prime)) throw new Error(`N = ${prime} is not a prime; the sequence needs a prime number of wells`);
	if (prime < 3 || prime > MAX_PRIME) throw new Error(`N = ${prime} is outside the supported 3…${MAX_PRIME}`);
}

/** s_n = n² mod N, n = 0 … N−1 (Schroeder, JASA 65:958, 1979). */
export function quadraticResidueSequence(prime: number): number[] {
	checkPrime(prime);
	return Array.from({ length: prime }, (_, n) => (n * n) % prime);
}

/** s_n = gⁿ mod N, n = 1 … N−1, for a primitive root g of N (Cox & D'Antonio, Acoustic Absorbers and Diffusers). */
export function primitiveRootSequence(prime: number, primitiveRoot?: number): { primitiveRoot: number; sequence: number[] } {
	checkPrime(prime);
	const g = primitiveRoot ?? smallestPrimitiveRoot(prime);
	if (!isPrimitiveRoot(g, prime)) {
		throw new Error(`g = ${g} is not a primitive root of ${prime}; the smallest one is ${smallestPrimitiveRoot(prime)}`);
	}
	return { primitiveRoot: g, sequence: Array.from({ length: prime - 1 }, (_, i) => powMod(g, i + 1, prime)) };
}

export interface DiffuserSpec {
	kind: DiffuserKind;
	/** Prime N. */
	prime: number;
	designFrequencyHz: number;
	/** Clear width of each well, m. */
	wellWidthM: number;
	/** Thickness of the fins between wells, m. */
	finThicknessM: number;
	/** Deepest well the build allows, m; the design frequency is raised to fit when needed. */
	maxDepthM?: number;
	/** Primitive root for the primitive-root kind; the smallest one when omitted. */
	primitiveRoot?: number;
	speedOfSound?: number;
}

export interface DiffuserDesign {
	kind: DiffuserKind;
	prime: number;
	primitiveRoot: number | null;
	sequence: number[];
	requestedDesignFrequencyHz: number;
	/** Design frequency actually used (raised when the max depth forced it). */
	designFrequencyHz: number;
	wellDepthsM: number[];
	deepestWellM: number;
	wellWidthM: number;
	finThicknessM: number;
	/** Upper limit of the working range, c/(2w): above it the wells no longer act as plane-wave ducts. */
	wellWidthLimitHz: number;
	workingRangeHz: { loHz: number; hiHz: number };
	/** m·N·f0 up to 20 kHz: all wells a multiple of λ/2 deep, the panel scatters like a flat plate. */
	flatPlateFrequenciesHz: number[];
	wellCount: number;
	/** N·w + (N + 1)·t with a fin on each side. */
	panelWidthM: number;
	warnings: string[];
}

const AUDIBLE_LIMIT_HZ = 20_000;

function checkPositive(value: number | undefined, what: string): void {
	if (!(typeof value === 'number' && Number.isFinite(value) && value > 0)) {
		throw new Error(`${what} must be a positive number, got ${String(value)}`);
	}
}

export function designDiffuser(spec: DiffuserSpec): DiffuserDesign {
	checkPositive(spec.designFrequencyHz, 'design frequency (Hz)');
	checkPositive(spec.wellWidthM, 'well width (m)');
	checkPositive(spec.finThicknessM, 'fin thickness (m)');
	if (spec.maxDepthM !== undefined) checkPositive(spec.maxDepthM, 'maximum depth (m)');
	const c = spec.speedOfSound ?? DEFAULT_SPEED_OF_SOUND;
	checkPositive(c, 'speed of sound (m/s)');

	let sequence: number[];
	let primitiveRoot: number | null = null;
	if (spec.kind === 'quadratic-residue') {
		sequence = quadraticResidueSequence(spec.prime);
	} else if (spec.kind === 'primitive-root') {
		const prd = primitiveRootSequence(spec.prime, spec.primitiveRoot);
		sequence = prd.sequence;
		primitiveRoot = prd.primitiveRoot;
	} else {
		throw new Error(`unknown diffuser kind "${String(spec.kind)}"`);
	}
	const N = spec.prime;
	const sMax = Math.max(...sequence);
	const warnings: string[] = [];

	let f0 = spec.designFrequencyHz;
	// d_n = s_n·λ0/(2N), λ0 = c/f0 (D'Antonio & Konnert, JAES 32:228, 1984)
	const deepestAt = (f: number) => (sMax * c) / (f * 2 * N);
	if (spec.maxDepthM !== undefined && deepestAt(f0) > spec.maxDepthM) {
		const raised = (sMax * c) / (2 * N * spec.maxDepthM);
		warnings.push(
			`the deepest well at ${formatHz(f0)} would be ${(deepestAt(f0) * 1000).toFixed(0)} mm, more than the ${(spec.maxDepthM * 1000).toFixed(0)} mm allowed; design frequency raised to ${formatHz(raised)}`
		);
		f0 = raised;
	}
	const lambda0 = c / f0;
	const wellDepthsM = sequence.map((s) => (s * lambda0) / (2 * N));
	const wellWidthLimitHz = c / (2 * spec.wellWidthM);
	if (wellWidthLimitHz <= f0) {
		warnings.push(
			`the well-width limit c/(2w) = ${formatHz(wellWidthLimitHz)} is not above the design frequency ${formatHz(f0)}; narrow the wells`
		);
	}
	const flatPlateFrequenciesHz: number[] = [];
	for (let m = 1; m * N * f0 <= AUDIBLE_LIMIT_HZ; m++) flatPlateFrequenciesHz.push(m * N * f0);
	const inside = flatPlateFrequenciesHz.filter((f) => f > f0 && f < wellWidthLimitHz);
	if (inside.length > 0) {
		warnings.push(`flat-plate frequencies inside the working range: ${inside.map(formatHz).join(', ')}`);
	}
	const wellCount = sequence.length;
	return {
		kind: spec.kind,
		prime: N,
		primitiveRoot,
		sequence,
		requestedDesignFrequencyHz: spec.designFrequencyHz,
		designFrequencyHz: f0,
		wellDepthsM,
		deepestWellM: Math.max(...wellDepthsM),
		wellWidthM: spec.wellWidthM,
		finThicknessM: spec.finThicknessM,
		wellWidthLimitHz,
		workingRangeHz: { loHz: f0, hiHz: Math.max(f0, wellWidthLimitHz) },
		flatPlateFrequenciesHz,
		wellCount,
		panelWidthM: wellCount * spec.wellWidthM + (wellCount + 1) * spec.finThicknessM,
		warnings
	};
}
