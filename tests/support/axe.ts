import { AxeBuilder } from '@axe-core/playwright';
import type { Page } from 'playwright-core';

/**
 * Runs axe-core (WCAG 2.1 A and AA rules, and best practices) on the page as it stands and returns
 * its violations, one line each: rule, impact, how many elements, the first element's selector.
 */
export async function axeViolations(page: Page): Promise<string[]> {
  // One axe.run from the page itself, with axe injected into its frames too ("legacy mode"):
  // the app has no frame from another origin (an outbox message's body is the app's own), so the
  // default's per-frame partial runs, finished on a blank page opened for each check, only cost
  // time (about half a second a page). Only violations are gathered in full (`resultTypes`):
  // axe still runs every rule on every element, but keeps one example of each pass instead of
  // every element that passed, which was a quarter of the sweep's time.
  const result = await new AxeBuilder({ page })
    .setLegacyMode()
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'])
    .options({ resultTypes: ['violations'] })
    .analyze();
  return result.violations.map((v) => `${v.id} (${v.impact}): ${v.nodes.length}× e.g. ${v.nodes[0]?.target.join(' ')} — ${v.help}`);
}
