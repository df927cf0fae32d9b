/** Conversion between the load units a series may be stored in. */

/** Watts per unit of each load unit the catalogue allows. */
const wattsPer: Record<string, number> = { W: 1, kW: 1e3, MW: 1e6 };

/** The factor that turns a value in `from` into `to` (e.g. kW → MW is 0.001). */
export function unitScale(from: string, to: string): number {
  const a = wattsPer[from];
  const b = wattsPer[to];
  if (a === undefined || b === undefined) throw new Error(`No conversion from ${from} to ${to}: both must be load units (W, kW, MW).`);
  return a / b;
}
