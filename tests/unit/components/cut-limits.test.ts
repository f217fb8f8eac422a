import { describe, expect, it } from 'vitest';
import { engineMessage, overCapReason } from '../../../components/workspace/cut-limits';
import { estimateCount } from '../../../lib/models';

describe('Generate refused ahead of the cap, engine errors in the form\'s words', () => {
  it('a 21/13 cubic approximant (185 472 vertices per cell, the model-set density count that tests/unit/models/icosahedral/approximant.test.ts checks) is over a 100 000 cap', () => {
    const params = { family: 'icosahedral', mode: 'approximant', order: '21/13', aR: 4.6, maxPoints: 100_000 };
    const expected = estimateCount(params);
    expect(expected).toBe(185_472);
    expect(overCapReason(params, expected)).toMatch(/About 185,472 points expected, more than the point cap of 100,000/);
    expect(overCapReason({ ...params, maxPoints: 200_000 }, expected)).toBeNull();
    // Without a cap of its own the default cap applies (2 000 000).
    expect(overCapReason({ family: 'icosahedral' }, 2_000_001)).toMatch(/point cap of 2,000,000/);
    expect(overCapReason({ family: 'icosahedral' }, null)).toBeNull();
  });

  it('names the field as the form labels it', () => {
    const params = { family: 'icosahedral', mode: 'approximant', order: '5/3', aR: 4.6 };
    const msg = engineMessage(params, { field: 'maxPoints', message: 'maxPoints: the 5/3 cell would hold about 10,336 points, more than the cap of 1,000; lower the size or raise maxPoints' });
    expect(msg).toMatch(/^Point cap: the 5\/3 cell would hold about 10,336 points/);
    expect(engineMessage(params, { message: 'no field here' })).toBe('no field here');
  });
});
