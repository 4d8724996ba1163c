import type { CoilSpec } from '@/physics';
import { coilSize, defaultView, displayTubeRadius, gridScaleFor, roundVec } from '@/components/bench/scene-framing';

describe('scene framing', () => {
  const pad: CoilSpec = { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: 0.0013 };
  const thin: CoilSpec = { kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: 0.00064 };

  test('coil size is the diameter or the length', () => {
    expect(coilSize(pad)).toBe(0.28);
    expect(coilSize({ ...thin, length: 0.5 })).toBe(0.5);
  });

  test('the tube is never thinner than the wire, thickened for visibility, and never past the pitch', () => {
    const r = displayTubeRadius(thin, 0.28);
    expect(r).toBeGreaterThanOrEqual(thin.wireDiameter / 2);
    expect(r).toBeLessThan(0.3 * (0.03 / 12) + 1e-12);
    const loop: CoilSpec = { kind: 'loop', radius: 0.05, wireDiameter: 0.0002 };
    expect(displayTubeRadius(loop, 0.1)).toBeCloseTo(0.0008, 12);
    const fat: CoilSpec = { kind: 'loop', radius: 0.05, wireDiameter: 0.004 };
    expect(displayTubeRadius(fat, 0.1)).toBe(0.002);
  });

  test('grid squares suit the scene', () => {
    expect(gridScaleFor(0.02).cell).toBe(0.001);
    expect(gridScaleFor(0.28)).toMatchObject({ cell: 0.01, section: 0.1 });
    expect(gridScaleFor(2).cell).toBe(0.1);
  });

  test('the default view looks at the centre of the box from the front (-y), above and to the right', () => {
    const v = defaultView({ min: [-0.14, -0.14, 0], max: [0.14, 0.14, 0.12] });
    expect(v.target).toEqual([0, 0, 0.06]);
    expect(v.position[1]).toBeLessThan(0);
    expect(v.position[0]).toBeGreaterThan(0);
    expect(v.position[2]).toBeGreaterThan(v.target[2]);
    const distance = Math.hypot(v.position[0] - v.target[0], v.position[1] - v.target[1], v.position[2] - v.target[2]);
    expect(distance).toBeGreaterThan(0.2);
  });

  test('views are stored to 0.01 mm, without negative zero', () => {
    expect(roundVec([0.123456789, -0.0000001, 1])).toEqual([0.12346, 0, 1]);
    expect(Object.is(roundVec([-0.0000001, 0, 0])[0], -0)).toBe(false);
  });
});
