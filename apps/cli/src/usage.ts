/** The help text of the loadwright command. */
export const usage = `Usage: loadwright <command> [options]

Commands:
  fit       --method yule-walker|cmle|nls|ridge|lasso --p P [--q Q]
            --method auto [--training-days 365]   (the nightly refit's own choice, its defaults, calibrated bands)
  forecast  <fit options> --horizon H [--levels 80,95] [--accept-unconverged]
  select    --method yule-walker|cmle|nls --max-p P [--max-q Q] [--criterion aic|aicc|bic] [--budget-ms T]
  backtest  <fit options> --horizon H --origins K [--season S] [--step S] [--min-train N] [--levels 80,95]

Fit options for ridge and lasso: --lags 1-48,168 (default 1..P), --lambda L or --select bic|validation.
Seasonal and regression options (fit, forecast, backtest; need a CSV with an hourly "timestamp" column):
  --seasonal none|profile|difference  --period 24|168  --profile-form additive|multiplicative  --log
  --temperature-column NAME [--heating-base C] [--cooling-base C]  --day-types  --holidays US[:TX]
  --time-zone America/Chicago   (and --method seasonal-naive, without --p)
  Their output is {"fit", "loadModel", …}; forecast rows after the last observation with an empty
  value carry the future temperatures.
Input: --input FILE, or standard input: CSV with a header whose "value" column (or only column) holds
the series, optionally with a "timestamp" column, or a JSON array of numbers.
Every fit prints a "warnings" array (no convergence, a near-unit root, an MA root at the boundary, a mean
outside the data), each with a suggestion; forecast refuses a fit that did not converge unless
--accept-unconverged is given.
Output: one JSON object on standard output. Bad input: exit status 2 and one line on standard error.
`;
