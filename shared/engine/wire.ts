/** Wire resistance from size, length and temperature (design/harness-format.md). */
import type { Wire, WireSize } from '../harness/schema';

/** Annealed copper at 20 °C, Ω·mm²/m (IEC 60028). */
export const COPPER_RESISTIVITY = 0.017241;
/** Temperature coefficient of copper at 20 °C, per °C (IEC 60028). */
export const COPPER_ALPHA = 0.00393;

/** Diameter in mm of an AWG gauge: d = 0.127 mm × 92^((36 − n)/39) (ASTM B258). */
export function awgDiameterMm(awg: number): number {
  return 0.127 * Math.pow(92, (36 - awg) / 39);
}

/** Cross-section in mm² of a wire size. */
export function crossSectionMm2(size: WireSize): number {
  if ('mm2' in size) return size.mm2;
  const d = awgDiameterMm(size.awg);
  return (Math.PI / 4) * d * d;
}

/** R = ρ·L/A at 20 °C, then R·(1 + α·(t − 20)). */
export function copperOhms(size: WireSize, lengthM: number, temperatureC = 20): number {
  const a = crossSectionMm2(size);
  if (!(a > 0) || !(lengthM >= 0)) return 0;
  return ((COPPER_RESISTIVITY * lengthM) / a) * (1 + COPPER_ALPHA * (temperatureC - 20));
}

/** A wire's resistance: its `ohms` override, else computed from copper. */
export function wireOhms(wire: Pick<Wire, 'size' | 'lengthM' | 'ohms'>, temperatureC = 20): number {
  if (wire.ohms !== undefined) return wire.ohms;
  return copperOhms(wire.size, wire.lengthM, temperatureC);
}
