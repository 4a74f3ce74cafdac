import { describe, expect, it } from 'vitest';
import { formatDistance } from '../../web/src/lib/format';

const NBSP = '\u00a0';

describe('distances in the unit a person reads', () => {
  it('when under a kilometre, then metres; under ten, km with one decimal; beyond, whole km', () => {
    expect(formatDistance(37)).toBe(`37${NBSP}m`);
    expect(formatDistance(999)).toBe(`999${NBSP}m`);
    expect(formatDistance(1520)).toBe(`1.5${NBSP}km`);
    expect(formatDistance(159_403)).toBe(`159${NBSP}km`);
    expect(formatDistance(null)).toBe('—');
  });
});
