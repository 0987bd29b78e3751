/** Molar gas constant, J/(mol·K) (CODATA 2018, exact). */
export const R = 8.314462618;
/** Standard pressure of the results, Pa (1 bar). */
export const STANDARD_PRESSURE_PA = 100000;
/** 1 atm in Pa; sources on this standard state are converted for gases. */
export const ATM_PA = 101325;
/** The conventional reference temperature, K. */
export const T298 = 298.15;
/** Above this pressure the ideal-gas K gets a `high-pressure` warning. */
export const HIGH_PRESSURE_BAR = 10;
/** Supported temperatures, K: a grid temperature or referenceK outside [1 K, 100 000 K] is refused. */
export const MIN_TEMPERATURE_K = 1;
export const MAX_TEMPERATURE_K = 100000;
/** Largest temperature grid the engine accepts. */
export const MAX_POINTS = 100000;

export const ENGINE_VERSION = "1.0.0";
