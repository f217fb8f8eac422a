import { describe, expect, it } from 'vitest';
import { readMeasured } from '../../../lib/formats/measured';

describe('measured two-column pattern reader', () => {
  it('reads whitespace columns with comments and a header naming the axis', () => {
    const p = readMeasured('# Cu Ka1 scan\n; operator note\nQ  intensity\n1.0 10\n2.0  20\n\n1.5 15\n');
    expect(p.axis).toBe('q');
    expect(Array.from(p.x)).toEqual([1, 1.5, 2]);
    expect(Array.from(p.intensity)).toEqual([10, 15, 20]);
    expect(p.comments).toEqual(['Cu Ka1 scan', 'operator note']);
  });
  it('reads comma-separated 2θ data with CRLF and a sigma column', () => {
    const p = readMeasured('2theta,I,sigma\r\n20.0,100,10\r\n20.02,110,10.5\r\n');
    expect(p.axis).toBe('2theta');
    expect(Array.from(p.sigma!)).toEqual([10, 10.5]);
  });
  it('d data (descending) is sorted ascending; axis from options', () => {
    const p = readMeasured('3.0 5\n2.0 7\n', { axis: 'd' });
    expect(p.axis).toBe('d');
    expect(Array.from(p.x)).toEqual([2, 3]);
  });
  it('names the line that is wrong', () => {
    expect(() => readMeasured('20 1\n21 2\n22 abc\n')).toThrow(/line 3: "abc" is not a number/);
    expect(() => readMeasured('20 1\n21\n')).toThrow(/line 2: expected two columns/);
    expect(() => readMeasured('20 1 1\n21 2\n')).toThrow(/line 2: found 2 columns/);
    expect(() => readMeasured('# only\n20 1\n')).toThrow(/at least two/);
    expect(() => readMeasured('20 1\n200 2\n')).toThrow(/line 2: 2θ = 200/);
    expect(() => readMeasured('20 1\n20 2\n')).toThrow(/appears twice/);
  });
});
