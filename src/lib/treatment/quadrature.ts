// Gauss–Legendre quadrature on [0, 1] (nodes by Newton iteration on P_n; Abramowitz & Stegun 25.4.29).

export interface QuadratureRule {
	readonly nodes: Float64Array;
	readonly weights: Float64Array;
}

const cache = new Map<number, QuadratureRule>();

/** n-point Gauss–Legendre rule mapped to [0, 1]; cached because the planner calls it often. */
export function gaussLegendreUnit(n: number): QuadratureRule {
	if (!Number.isInteger(n) || n < 1 || n > 512) {
		throw new Error(`Gauss–Legendre order must be an integer 1…512, got ${n}`);
	}
	const hit = cache.get(n);
	if (hit) return hit;
	const nodes = new Float64Array(n);
	const weights = new Float64Array(n);
	for (let i = 0; i < Math.ceil(n / 2); i++) {
		// Chebyshev-like first guess of the i-th root, then Newton on P_n.
		let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
		let dp = 0;
		for (let iter = 0; iter < 100; iter++) {
			let p0 = 1;
			let p1 = x;
			for (let k = 2; k <= n; k++) {
				const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
				p0 = p1;
				p1 = p2;
			}
			// p1 = P_n(x), p0 = P_{n−1}(x); P_n' = n·(x·P_n − P_{n−1})/(x² − 1)
			dp = (n * (x * p1 - p0)) / (x * x - 1);
			const dx = p1 / dp;
			x -= dx;
			if (Math.abs(dx) < 1e-15) break;
		}
		const w = 2 / ((1 - x * x) * dp * dp);
		// Map [−1, 1] → [0, 1].
		nodes[i] = (1 - x) / 2;
		nodes[n - 1 - i] = (1 + x) / 2;
		weights[i] = w / 2;
		weights[n - 1 - i] = w / 2;
	}
	const rule = { nodes, weights };
	cache.set(n, rule);
	return rule;
}

/** ∫₀¹ f(u) du with an n-point Gauss–Legendre rule. */
export function integrateUnit(f: (u: number) => number, n = 48): number {
	const { nodes, weights } = gaussLegendreUnit(n);
	let sum = 0;
	for (let i = 0; i < n; i++) sum += weights[i] * f(nodes[i]);
	return sum;
}
