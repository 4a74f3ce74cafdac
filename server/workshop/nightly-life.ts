/**
 * The life resolver the nightly job uses (issue 5's hook): the workshop's fleet-blended and
 * test-lane-calibrated life; if it cannot be built, the rated life, with a warning in the log.
 */
import type { Logger } from '../logger';
import { ratedLife, type LifeResolver } from '../wear/wear';
import type { Config } from '../config';
import { createWorkshopLifeResolver } from './life';

export async function workshopLifeOrRated(config: Pick<Config, 'workshop'>, log?: Pick<Logger, 'warn'>): Promise<LifeResolver> {
  try {
    return await createWorkshopLifeResolver(config.workshop);
  } catch (err) {
    log?.warn?.(`workshop life not available, using the rated life: ${(err as Error).message}`);
    return ratedLife;
  }
}
