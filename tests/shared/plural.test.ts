import { describe, expect, it } from 'vitest';
import { countOf, plural } from '../../shared/domain/plural';

// English cardinal plural rule: "one" only for exactly 1 with no visible fraction digits
// (Unicode CLDR plural rules, language "en": one → i = 1 and v = 0).
describe('plural and countOf', () => {
  it('uses the singular only for exactly one', () => {
    expect(countOf(1, 'tree')).toBe('1 tree');
    expect(countOf(0, 'tree')).toBe('0 trees');
    expect(countOf(2, 'tree')).toBe('2 trees');
    expect(countOf(1.5, 'day')).toBe('1.5 days');
  });
  it('takes an irregular plural and groups thousands', () => {
    expect(countOf(1, 'variety', 'varieties')).toBe('1 variety');
    expect(countOf(3, 'variety', 'varieties')).toBe('3 varieties');
    expect(countOf(1200, 'report')).toBe('1,200 reports');
    expect(plural('grower', 21)).toBe('growers');
  });
});
