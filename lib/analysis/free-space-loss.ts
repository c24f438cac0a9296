/**
 * 20·log10(4π·10⁹ / c) with c = 299 792 458 m/s is 32.4478 dB: the constant that turns
 * 20·log10(4πd/λ) into MHz and km. DESIGN.md §5 fixes it at 32.45; ITU-R P.525-4 §2.2 prints it
 * rounded to 32.4, which reads 0.05 dB lower at every distance.
 */
const FREE_SPACE_CONSTANT_DB = 32.45;

/**
 * Free-space basic transmission loss between isotropic antennas (ITU-R P.525-4, §2.2,
 * point-to-point link): L = 32.45 + 20·log10(f [MHz]) + 20·log10(d [km]) dB, the decibel form of
 * (4πd/λ)². No ground, terrain, body or antenna effects. It is a far-field formula: below a few
 * wavelengths (λ = 300 / f[MHz] metres, 0.35 m at 868 MHz) it is only a reference line.
 *
 * NaN in either argument (a missing sample) gives NaN, so it can be mapped over a gappy series.
 *
 * Cost: O(1).
 *
 * @param frequencyMhz carrier frequency in MHz (e.g. 868, 915, 2400)
 * @param distanceM distance between the antennas in metres
 * @returns loss in dB (positive; larger = weaker received signal)
 * @throws {RangeError} when either argument is zero, negative or infinite
 * @example
 * freeSpaceLossDb(2400, 1000); // => 100.054… (32.45 + 67.604 + 0)
 */
export function freeSpaceLossDb(frequencyMhz: number, distanceM: number): number {
  if (Number.isNaN(frequencyMhz) || Number.isNaN(distanceM)) return NaN;
  if (!(frequencyMhz > 0) || !Number.isFinite(frequencyMhz)) {
    throw new RangeError(`freeSpaceLossDb requires a positive, finite frequency in MHz (got ${frequencyMhz})`);
  }
  if (!(distanceM > 0) || !Number.isFinite(distanceM)) {
    throw new RangeError(`freeSpaceLossDb requires a positive, finite distance in metres (got ${distanceM})`);
  }
  return FREE_SPACE_CONSTANT_DB + 20 * Math.log10(frequencyMhz) + 20 * Math.log10(distanceM / 1000);
}
