/**
 * Resistance of annealed copper conductors (IEC 60028 values).
 */

/** Resistivity of annealed copper at 20 °C, Ω·mm²/m (1/58, i.e. 0.017241). */
export const COPPER_RESISTIVITY_20C = 1 / 58;
/** Temperature coefficient of resistance of annealed copper referred to 20 °C, per °C. */
export const COPPER_ALPHA_20 = 0.00393;
/** Reference temperature of the two constants above, °C. */
export const COPPER_REFERENCE_TEMP_C = 20;

/** Metres in one international foot; kept here so this module stands alone. */
const FOOT_M = 0.3048;

/** Resistivity of annealed copper at `temperatureC`, Ω·mm²/m (linear model about 20 °C). */
export function copperResistivity(temperatureC: number = COPPER_REFERENCE_TEMP_C): number {
  return COPPER_RESISTIVITY_20C * (1 + COPPER_ALPHA_20 * (temperatureC - COPPER_REFERENCE_TEMP_C));
}

/** DC resistance in Ω per metre of a copper conductor of `areaMm2` at `temperatureC`. */
export function resistancePerMetre(
  areaMm2: number,
  temperatureC: number = COPPER_REFERENCE_TEMP_C,
): number {
  return copperResistivity(temperatureC) / areaMm2;
}

/** DC resistance in Ω per kilometre of a copper conductor of `areaMm2` at `temperatureC`. */
export function ohmsPerKm(areaMm2: number, temperatureC: number = COPPER_REFERENCE_TEMP_C): number {
  return resistancePerMetre(areaMm2, temperatureC) * 1000;
}

/** DC resistance in Ω per 1000 ft of a copper conductor of `areaMm2` at `temperatureC`. */
export function ohmsPer1000Ft(
  areaMm2: number,
  temperatureC: number = COPPER_REFERENCE_TEMP_C,
): number {
  return resistancePerMetre(areaMm2, temperatureC) * 1000 * FOOT_M;
}

/** DC resistance in Ω of `lengthM` metres of copper conductor of `areaMm2` at `temperatureC`. */
export function copperResistance(
  areaMm2: number,
  lengthM: number,
  temperatureC: number = COPPER_REFERENCE_TEMP_C,
): number {
  return resistancePerMetre(areaMm2, temperatureC) * lengthM;
}
