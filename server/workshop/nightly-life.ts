/**
 * The life phase of the nightly job: refit each spec's life model to the fleet's removals and
 * build the resolver the wear and prediction phases measure each damper against; if that
 * fails, the prior, with a warning in the log. `bandRows`: the severity totals the refit read.
 */
import type { Logger } from '../logger';
import type { LifeResolver } from '../wear/wear';
import type { Config } from '../config';
import { createWorkshopLifeResolver, priorLifeResolver, refitLifeModels } from './life';

export async function refitAndResolveLife(config: Config, now: Date, log?: Pick<Logger, 'warn'>): Promise<{ resolver: LifeResolver; fitted: number; bandRows: number }> {
  const read = { bandRows: 0 };
  try {
    const models = await refitLifeModels(config.workshop.life, now, read);
    return { resolver: await createWorkshopLifeResolver(config.workshop.life.prior), fitted: [...models.values()].filter((m) => m.source === 'fleet').length, bandRows: read.bandRows };
  } catch (err) {
    log?.warn?.(`damper life model not available, using the prior: ${(err as Error).message}`);
    return { resolver: priorLifeResolver(config.workshop.life.prior), fitted: 0, bandRows: read.bandRows };
  }
}
