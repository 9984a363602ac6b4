/**
 * Energy of an ideal capacitance (DESIGN §3.1–3.2), the closed forms every figure uses:
 * E = ½·C·V² (OpenStax University Physics Volume 2, section 8.3), usable energy between two
 * voltages the difference of two such terms.
 */

/** ½·C·V² (J) */
export function storedEnergy(capacitance: number, voltage: number): number {
  return 0.5 * capacitance * voltage * voltage;
}

/** ½·C·(V_max² − V_min²) (J): what a bank gives between its working and minimum voltage */
export function usableEnergy(capacitance: number, maxVoltage: number, minVoltage: number): number {
  return 0.5 * capacitance * (maxVoltage * maxVoltage - minVoltage * minVoltage);
}

/** C = 2E / (V_max² − V_min²) (F): the capacitance that gives `energy` between the two voltages */
export function capacitanceForEnergy(energy: number, maxVoltage: number, minVoltage: number): number {
  return (2 * energy) / (maxVoltage * maxVoltage - minVoltage * minVoltage);
}

/** P·t (J): the least energy a constant-power backup needs (all of it, with no ESR loss) */
export function backupEnergy(power: number, seconds: number): number {
  return power * seconds;
}

/** ΔV / I (Ω): the most ESR a bank may have for a peak current to drop the voltage by at most ΔV (Ohm's law) */
export function maxEsrFor(maxDrop: number, current: number): number {
  return maxDrop / current;
}
