import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { binFeatures } from '../../../backend/src/modeling/binning.js';
import { buildTable } from '../../../backend/src/modeling/table.js';

describe('binning a numeric column', () => {
  it('keeps the order of values, puts missing values in bin 0 and separates every distinct value when there are few', () => {
    fc.assert(
      fc.property(
        fc.array(fc.option(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { nil: null }), {
          minLength: 1,
          maxLength: 400,
        }),
        fc.integer({ min: 2, max: 64 }),
        (values, maxBins) => {
          const table = buildTable([{ name: 'x', kind: 'numeric', values }]);
          const [feature] = binFeatures(table, ['x'], maxBins);
          const present = values.filter((v): v is number => v !== null);
          const distinct = new Set(present).size;
          expect(feature.nBins).toBeLessThanOrEqual(maxBins);
          if (distinct <= maxBins) expect(feature.nBins).toBe(distinct);
          values.forEach((v, i) => {
            if (v === null) expect(feature.bins[i]).toBe(0);
            else {
              const b = feature.bins[i];
              expect(v).toBeGreaterThanOrEqual(feature.binMin[b]);
              expect(v).toBeLessThanOrEqual(feature.binMax[b]);
            }
          });
          // bins never overlap
          for (let b = 1; b < feature.nBins; b++)
            expect(feature.binMax[b]).toBeLessThan(feature.binMin[b + 1]);
        },
      ),
      { numRuns: 200 },
    );
  });
});
