// Properties of air used throughout the treatment computations.

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
