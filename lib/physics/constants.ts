/**
 * Physical constants of the 2019 SI, in which k and q are exact (CODATA 2018).
 *
 * @module
 */

/** Boltzmann constant k in J/K, exact in the 2019 SI (CODATA 2018). */
export const BOLTZMANN = 1.380649e-23;

/** Elementary charge q in C, exact in the 2019 SI (CODATA 2018). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** Offset between the Celsius and kelvin scales: T[K] = t[°C] + 273.15 exactly. */
export const CELSIUS_OFFSET = 273.15;

/** The temperature every library function assumes when none is given: 300 K. */
export const DEFAULT_TEMPERATURE = 300;
