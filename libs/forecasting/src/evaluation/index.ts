// Forecast evaluation: accuracy metrics, interval and quantile scores, benchmarks, skill and rolling-origin backtests.
export { mae, rmse, mape, smape, mase, maseScale } from './metrics';
export {
  dailyPeaks,
  dailyPeakError,
  timeOfPeakError,
  type DayLayout,
  type DailyPeak,
  type DailyPeakError,
  type TimeOfPeakError,
} from './peak-metrics';
export { coverage, winkler, pinball } from './interval-scores';
export { seasonalNaive, likeDay, type BenchmarkForecast, type LikeDayOptions } from './benchmarks';
export { skillScore } from './skill-score';
export {
  rollingOriginBacktest,
  type BacktestOptions,
  type BacktestBenchmark,
  type BacktestResult,
  type BacktestMetrics,
  type HorizonMetrics,
  type IntervalMetrics,
  type BacktestPeakMetrics,
  type BacktestForecast,
  type BacktestInterval,
  type Forecaster,
} from './backtest';
