/**
 * The USAccDeaths hold-out used by the evaluation specs, loaded from fixtures/reference/ (copied unchanged from
 * the shared reference set): data/USAccDeaths.json (R datasets::USAccDeaths) and ref/USAccDeaths.json,
 * key `seasonal.holdout` (R 4.2.2, forecast 8.20; last 12 months held out, see its train_expr/test_expr).
 */
import { readFileSync } from 'node:fs';

const root = new URL('../../../../fixtures/reference/', import.meta.url);
const data = JSON.parse(readFileSync(new URL('data/USAccDeaths.json', root), 'utf8')) as { values: number[] };
const ref = JSON.parse(readFileSync(new URL('ref/USAccDeaths.json', root), 'utf8'));

/** The R hold-out block: test values, the two forecasts with their accuracy rows, scales and the pitfall note. */
export const holdout = ref.seasonal.holdout;
/** Seasonal period of the monthly series. */
export const period: number = ref.seasonal.period;
/** The full monthly series, 1973–1978. */
export const series: number[] = data.values;
/** The first n − m values: the training part R used (train_expr). */
export const training: number[] = data.values.slice(0, data.values.length - period);
