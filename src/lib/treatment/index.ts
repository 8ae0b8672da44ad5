// Public API of the treatment-planning computations.
export * from './air';
export * from './bands';
export * from './materials';
export * from './surfaces';
export * from './porous';
export * from './membrane';
export * from './diffuser';
export * from './diffuserSvg';
export * from './airAbsorption';
export * from './reverb';
export * from './calibrate';
export * from './planner';
export * from './units';
export * from './parts';
export * from './buildsheet';
export * from './cutlist';
export * from './cuttingDiagramSvg';
export type { Complex } from './complex';
