// Minimal complex arithmetic for impedance calculations (time convention e^{+jωt}).

export interface Complex {
	readonly re: number;
	readonly im: number;
}

export const complex = (re: number, im = 0): Complex => ({ re, im });

export const add = (a: Complex, b: Complex): Complex => complex(a.re + b.re, a.im + b.im);
export const sub = (a: Complex, b: Complex): Complex => complex(a.re - b.re, a.im - b.im);
export const mul = (a: Complex, b: Complex): Complex =>
	complex(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const scale = (a: Complex, s: number): Complex => complex(a.re * s, a.im * s);

export function div(a: Complex, b: Complex): Complex {
	const d = b.re * b.re + b.im * b.im;
	if (d === 0) throw new Error('complex division by zero');
	return complex((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
}

export const abs = (a: Complex): number => Math.hypot(a.re, a.im);

/** sin(x + jy) = sin x cosh y + j cos x sinh y */
export const sin = (a: Complex): Complex =>
	complex(Math.sin(a.re) * Math.cosh(a.im), Math.cos(a.re) * Math.sinh(a.im));

/** cos(x + jy) = cos x cosh y − j sin x sinh y */
export const cos = (a: Complex): Complex =>
	complex(Math.cos(a.re) * Math.cosh(a.im), -Math.sin(a.re) * Math.sinh(a.im));

export const J: Complex = complex(0, 1);
