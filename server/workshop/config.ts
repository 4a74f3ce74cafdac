/** Settings of the workshop area: parsed with the rest of the configuration in server/config.ts. */
import type { Config } from '../config';

export type WorkshopConfig = Config['workshop'];
