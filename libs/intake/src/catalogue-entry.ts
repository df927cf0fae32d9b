/** What intake needs to know of a series in the catalogue. */
export interface CatalogueEntry {
  id: number;
  key: string;
  kind: 'load' | 'temperature';
  /** Stored unit: W, kW, MW, degC, degF. */
  unit: string;
  intervalMinutes: number;
  timeZone: string;
  timestampsMark: 'start' | 'end';
}
