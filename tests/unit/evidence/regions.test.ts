import { forEachRegionPixel, regionBounds, regionPixelCount, regionsOverlap } from '../../../shared/evidence/regions';
import { Region } from '../../../shared/schemas/evidence-analysis';

describe('regions on an image', () => {
  it('takes the pixels whose centres lie in a box, clamped to the image', () => {
    const box = { shape: 'box', x: 2, y: 3, width: 4, height: 2 } as const;
    const visited: [number, number][] = [];
    expect(forEachRegionPixel(box, 100, 100, (x, y) => visited.push([x, y]))).toBe(8);
    expect(visited[0]).toEqual([2, 3]);
    expect(visited[7]).toEqual([5, 4]);
    // Half-pixel edges: centres 2.5…5.5 lie in [2.4, 6.4).
    expect(regionPixelCount({ shape: 'box', x: 2.4, y: 0, width: 4, height: 1 }, 100, 100)).toBe(4);
    expect(regionBounds({ shape: 'box', x: 95, y: 95, width: 20, height: 20 }, 100, 100)).toEqual({
      x0: 95,
      y0: 95,
      x1: 100,
      y1: 100,
    });
    expect(regionPixelCount({ shape: 'box', x: 200, y: 0, width: 5, height: 5 }, 100, 100)).toBe(0);
  });

  it('takes discs around tapped points once each, however they overlap', () => {
    // A disc of radius 5 around a pixel centre holds the lattice points within 5 of it: 81 (Gauss circle count N(5) = 81).
    expect(regionPixelCount({ shape: 'points', points: [{ x: 50.5, y: 50.5 }], radiusPx: 5 }, 100, 100)).toBe(81);
    const twice: Region = {
      shape: 'points',
      points: [
        { x: 50.5, y: 50.5 },
        { x: 50.5, y: 50.5 },
      ],
      radiusPx: 5,
    };
    expect(regionPixelCount(twice, 100, 100)).toBe(81);
    // Clamped at the corner: a quarter-ish disc.
    expect(regionPixelCount({ shape: 'points', points: [{ x: 0, y: 0 }], radiusPx: 5 }, 100, 100)).toBeLessThan(81 / 3);
  });

  it('tells whether two regions share a pixel', () => {
    const box = { shape: 'box', x: 0, y: 0, width: 10, height: 10 } as const;
    expect(regionsOverlap(box, { shape: 'box', x: 9, y: 9, width: 5, height: 5 }, 100, 100)).toBe(true);
    expect(regionsOverlap(box, { shape: 'box', x: 10, y: 0, width: 5, height: 5 }, 100, 100)).toBe(false);
    expect(regionsOverlap(box, { shape: 'points', points: [{ x: 14, y: 5 }], radiusPx: 3.9 }, 100, 100)).toBe(false);
    expect(regionsOverlap(box, { shape: 'points', points: [{ x: 14, y: 5 }], radiusPx: 4.6 }, 100, 100)).toBe(true);
  });

  it('validates the shapes the client sends', () => {
    expect(Region.safeParse({ shape: 'box', x: 1, y: 1, width: 0, height: 3 }).success).toBe(false);
    expect(Region.safeParse({ shape: 'points', points: [], radiusPx: 3 }).error?.issues[0].message).toBe(
      'Tap at least one point.',
    );
    expect(Region.safeParse({ shape: 'box', x: -1, y: 1, width: 2, height: 3 }).error?.issues[0].message).toBe(
      'Box x cannot be negative.',
    );
    expect(Region.safeParse({ shape: 'points', points: [{ x: 1, y: 2 }], radiusPx: 8 }).success).toBe(true);
  });
});
