import { describe, expect, it } from 'vitest';
import { wearBands, wearRule, wearTone } from '../../web/src/lib/wear';

describe('wear words on screen', () => {
  it('when the inspection threshold is 80 %, then the damper cards use the bands the scheduler and the wear page use', () => {
    expect(wearBands(0.8)).toEqual({ watchFrom: 0.6, dueFrom: 0.8, overdueFrom: 1 });
    expect([0.59, 0.6, 0.76, 0.8, 0.99, 1, 2.5].map((u) => wearTone(u, 0.8))).toEqual(['ok', 'watch', 'watch', 'due', 'due', 'overdue', 'overdue']);
    expect(wearRule(0.8)).toBe('Watch from 60 %, inspect from 80 % of rated life used.');
  });

  it('when the threshold is set to 70 %, then inspection is asked from 70 % and watching from 53 %', () => {
    expect(wearTone(0.72, 0.7)).toBe('due');
    expect(wearTone(0.72, 0.8)).toBe('watch');
    expect(wearRule(0.7)).toBe('Watch from 53 %, inspect from 70 % of rated life used.');
  });

  it('when there is no estimate, then the word is neutral', () => {
    expect(wearTone(null)).toBe('neutral');
    expect(wearTone(Number.NaN)).toBe('neutral');
  });
});
