import { describe, expect, it } from 'vitest';
import { growingDegreeDays } from '../../shared/domain/gdd';

describe('growingDegreeDays', () => {
  it('uses the simple average method', () => {
    // Midwestern Regional Climate Center, GDD information page: mean 75 F, base 65 gives 10.
    expect(growingDegreeDays(85, 65, 65)).toBe(10);
    // Iowa State University, Agronomy 541 notes: 70/50 F at base 50 gives 10.
    expect(growingDegreeDays(70, 50)).toBe(10);
    expect(growingDegreeDays(40, 20)).toBe(0);
  });

  it('uses the modified 86/50 method', () => {
    // Midwestern Regional Climate Center, agriculture special topics: Tmax 92, Tmin 68 gives (86 + 68)/2 - 50 = 27.
    expect(growingDegreeDays(92, 68, 50, 'modified-86-50')).toBe(27);
    // The cap gives at most 36 a day, and a cold night is raised to 50 F (same source).
    expect(growingDegreeDays(100, 90, 50, 'modified-86-50')).toBe(36);
    expect(growingDegreeDays(70, 40, 50, 'modified-86-50')).toBe(10);
  });
});
