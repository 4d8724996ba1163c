import { axisIssues, axisValueCount, expandAxis, type PlanAxis } from '../../../src/lib/plans/axes';

const range = (start: number, stop: number, step: number): PlanAxis => ({ quantity: 'distance', displayUnit: 'cm', mode: 'range', start, stop, step });

describe('axis expansion', () => {
  it('includes a range stop that is a whole number of steps away despite binary rounding', () => {
    // 0.15 / 0.05 is 2.9999999999999996 in binary; the stop must still be included and read as typed
    expect(expandAxis(range(0.05, 0.2, 0.05))).toEqual([0.05, 0.1, 0.15, 0.2]);
    expect(expandAxis(range(0.1, 0.3, 0.1))).toEqual([0.1, 0.2, 0.3]);
    expect(expandAxis({ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 15 })).toEqual([0, 15, 30, 45, 60, 75, 90]);
  });

  it('stops before a stop that is not on the grid, runs downwards, and gives one value when start = stop', () => {
    expect(expandAxis(range(0, 1, 0.3))).toEqual([0, 0.3, 0.6, 0.9]);
    expect(expandAxis(range(0.2, 0.05, 0.05))).toEqual([0.2, 0.15, 0.1, 0.05]);
    expect(expandAxis(range(0.1, 0.1, 0.05))).toEqual([0.1]);
    expect(axisValueCount(range(0, 1, 0.001))).toBe(1001);
  });

  it('spaces a count linearly or logarithmically with exact ends', () => {
    expect(expandAxis({ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'count', start: 0, stop: 90, count: 4, spacing: 'linear' })).toEqual([0, 30, 60, 90]);
    const log = expandAxis({ quantity: 'frequencyHz', displayUnit: 'kHz', mode: 'count', start: 1e3, stop: 1e6, count: 4, spacing: 'log' });
    expect(log).toEqual([1e3, 1e4, 1e5, 1e6]);
    expect(expandAxis({ quantity: 'distance', displayUnit: 'cm', mode: 'count', start: 0.05, stop: 0.2, count: 1, spacing: 'linear' })).toEqual([0.05]);
  });

  it('keeps a list as given', () => {
    expect(expandAxis({ quantity: 'loadResistance', displayUnit: 'ohm', mode: 'list', values: [50, 10, 100] })).toEqual([50, 10, 100]);
  });

  it('refuses a zero step, log spacing through zero, an empty list and values outside the quantity', () => {
    expect(axisIssues(range(0, 1, 0))).toEqual([{ path: 'step', message: 'The step must be greater than zero.' }]);
    expect(axisIssues({ quantity: 'frequencyHz', displayUnit: 'Hz', mode: 'count', start: 0, stop: 1e6, count: 5, spacing: 'log' }).map((i) => i.path)).toContain('start');
    expect(axisIssues({ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [] }).map((i) => i.path)).toEqual(['values']);
    expect(axisIssues({ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 200] })).toEqual([{ path: 'values.1', message: 'Tilts must be between -180 and 180 degrees.' }]);
    expect(axisIssues({ quantity: 'loadResistance', displayUnit: 'ohm', mode: 'list', values: [0] }).map((i) => i.path)).toEqual(['values.0']);
    expect(axisIssues(range(0.05, 0.2, 0.05))).toEqual([]);
  });
});
