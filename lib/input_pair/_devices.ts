/**
 * The few device formulas the pair needs (REFERENCE §2), kept private until lib/devices/ offers
 * them. Conventions: ro = VA/Ic (MOSFET: 1/(λ·Id)); Id = ½·kn·Vov² with kn = k′·W/L.
 *
 * @module
 */

/** BJT transconductance gm = Ic/VT, S. */
export function _bjtTransconductance(collectorCurrent: number, thermalVoltage: number): number {
  return collectorCurrent / thermalVoltage;
}

/** BJT output resistance ro = VA/Ic, Ω (Infinity without Early effect). */
export function _bjtOutputResistance(collectorCurrent: number, earlyVoltage: number): number {
  return earlyVoltage / collectorCurrent;
}

/** BJT VBE at a collector current: VT·ln(Ic/Is + 1), V. */
export function _bjtBaseEmitterVoltage(
  collectorCurrent: number,
  saturationCurrent: number,
  thermalVoltage: number,
): number {
  return thermalVoltage * Math.log(collectorCurrent / saturationCurrent + 1);
}

/** MOSFET overdrive at a drain current (square law, λ neglected): √(2Id/kn), V. */
export function _mosOverdrive(drainCurrent: number, transconductanceParameter: number): number {
  return Math.sqrt((2 * drainCurrent) / transconductanceParameter);
}

/** MOSFET transconductance √(2·kn·Id) = 2Id/Vov, S. */
export function _mosTransconductance(
  drainCurrent: number,
  transconductanceParameter: number,
): number {
  return Math.sqrt(2 * transconductanceParameter * drainCurrent);
}

/** MOSFET output resistance 1/(λ·Id), Ω (Infinity for λ = 0). */
export function _mosOutputResistance(drainCurrent: number, lambda: number): number {
  return 1 / (lambda * drainCurrent);
}
