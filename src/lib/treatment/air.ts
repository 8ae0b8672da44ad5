// Air in the treatment computations: its default properties, and the sound it absorbs over a
// path, ISO 9613-1:1993, clause 6 (equations 3–5 and annex B for h).

/** Speed of sound used by default (m/s): air at about 20 °C, the common handbook value (331.3·√(1 + 20/273.15) = 343.2; Kinsler et al., Fundamentals of Acoustics, from memory). */
export const DEFAULT_SPEED_OF_SOUND = 343;

/** Density of air at about 20 °C (kg/m³); common handbook value. */
export const DEFAULT_AIR_DENSITY = 1.21;

/** Ratio of specific heats of air; an enclosed porous fill makes compression isothermal. */
export const AIR_HEAT_CAPACITY_RATIO = 1.4;

export interface AirProperties {
	/** Speed of sound c0 in m/s. */
	speedOfSound: number;
	/** Density ρ0 in kg/m³. */
	density: number;
}

export const DEFAULT_AIR: AirProperties = {
	speedOfSound: DEFAULT_SPEED_OF_SOUND,
	density: DEFAULT_AIR_DENSITY
};

/** Throws unless the air properties are positive finite numbers. */
export function checkAir(air: AirProperties): void {
	if (!(air.speedOfSound > 0) || !Number.isFinite(air.speedOfSound)) {
		throw new Error(`speed of sound must be a positive number of m/s, got ${air.speedOfSound}`);
	}
	if (!(air.density > 0) || !Number.isFinite(air.density)) {
		throw new Error(`air density must be a positive number of kg/m³, got ${air.density}`);
	}
}

export interface AtmosphereConditions {
	temperatureC: number;
	/** Relative humidity, % (the standard covers 10 … 100 %). */
	relativeHumidityPct: number;
	/** Ambient pressure, kPa. */
	pressureKPa?: number;
}

const REFERENCE_PRESSURE_KPA = 101.325;
const REFERENCE_TEMPERATURE_K = 293.15;
const TRIPLE_POINT_K = 273.16;
/** 10·lg(e): converts a level decay in dB to nepers of intensity. */
const DB_PER_NEPER_INTENSITY = 10 * Math.LOG10E;

export const STANDARD_ROOM_AIR: AtmosphereConditions = { temperatureC: 20, relativeHumidityPct: 50, pressureKPa: 101.325 };

function checkConditions(c: AtmosphereConditions): void {
	if (!(c.temperatureC >= -20 && c.temperatureC <= 50)) {
		throw new Error(`temperature ${c.temperatureC} °C is outside ISO 9613-1's −20 … 50 °C`);
	}
	if (!(c.relativeHumidityPct > 0 && c.relativeHumidityPct <= 100)) {
		throw new Error(`relative humidity must be above 0 and at most 100 %, got ${c.relativeHumidityPct}`);
	}
	const p = c.pressureKPa ?? REFERENCE_PRESSURE_KPA;
	if (!(p > 0 && Number.isFinite(p))) throw new Error(`pressure must be a positive number of kPa, got ${p}`);
}

/** Pure-tone attenuation coefficient α in dB per metre at frequency f (ISO 9613-1:1993, eq. 5). */
export function airAttenuationDbPerM(frequencyHz: number, conditions: AtmosphereConditions = STANDARD_ROOM_AIR): number {
	if (!(frequencyHz > 0 && Number.isFinite(frequencyHz))) throw new Error(`frequency must be positive, got ${frequencyHz} Hz`);
	checkConditions(conditions);
	const T = conditions.temperatureC + 273.15;
	const paRel = (conditions.pressureKPa ?? REFERENCE_PRESSURE_KPA) / REFERENCE_PRESSURE_KPA;
	const tRel = T / REFERENCE_TEMPERATURE_K;
	// psat/pr = 10^C, C = −6.8346·(T01/T)^1.261 + 4.6151 (annex B, eq. B.1–B.2)
	const saturation = 10 ** (-6.8346 * (TRIPLE_POINT_K / T) ** 1.261 + 4.6151);
	// molar concentration of water vapour, % (eq. B.1)
	const h = (conditions.relativeHumidityPct * saturation) / paRel;
	// relaxation frequencies of oxygen and nitrogen (eq. 3 and 4)
	const frO = paRel * (24 + (4.04e4 * h * (0.02 + h)) / (0.391 + h));
	const frN = paRel * tRel ** -0.5 * (9 + 280 * h * Math.exp(-4.17 * (tRel ** (-1 / 3) - 1)));
	const f2 = frequencyHz * frequencyHz;
	return (
		8.686 *
		f2 *
		(1.84e-11 / paRel * tRel ** 0.5 +
			tRel ** -2.5 *
				((0.01275 * Math.exp(-2239.1 / T)) / (frO + f2 / frO) + (0.1068 * Math.exp(-3352 / T)) / (frN + f2 / frN)))
	);
}

/** Intensity attenuation coefficient m (1/m) as used in 4mV: m = α_dB / (10·lg e). */
export function airIntensityAttenuationPerM(frequencyHz: number, conditions: AtmosphereConditions = STANDARD_ROOM_AIR): number {
	return airAttenuationDbPerM(frequencyHz, conditions) / DB_PER_NEPER_INTENSITY;
}
