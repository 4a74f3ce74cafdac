/**
 * The `weibull` command of the CLI (server/cli/index.ts calls it): a CSV of lives with
 * failure flags → the maximum-likelihood fit as `{ shape, scale, b10, failures, suspensions }`.
 *
 * @module
 */
import { fitWeibull, parseLifeCsv } from '../reliability/weibull';

/**
 * @param csvText CSV with the columns `life` and `failed` (1 removal, 0 still running)
 * @returns shape [1], scale and B10 [unit of the lives], counts
 * @throws WeibullInputError naming the bad row or the reason the fit is impossible
 */
export function weibullCommand(csvText: string) {
  const f = fitWeibull(parseLifeCsv(csvText));
  return { shape: f.shape, scale: f.scale, b10: f.b10, failures: f.failures, suspensions: f.suspensions };
}
