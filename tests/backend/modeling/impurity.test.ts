import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { entropy, gini, informationGain } from '../../../backend/src/modeling/impurity.js';
import { playTennis } from './datasets.js';

function countsBy(attribute: keyof (typeof playTennis)[number]) {
  const groups = new Map<string, [number, number]>();
  for (const row of playTennis) {
    const part = groups.get(row[attribute]) ?? [0, 0];
    part[0] += 1;
    part[1] += row.play === 'Yes' ? 1 : 0;
    groups.set(row[attribute], part);
  }
  return [...groups.values()];
}

describe('impurity and information gain', () => {
  // Quinlan (1986), Table 1; Mitchell, Machine Learning (1997), ch. 3, Table 3.2
  it('gives the PlayTennis entropy and the gain of each attribute as the textbooks print them', () => {
    expect(entropy(14, 9)).toBeCloseTo(0.940286, 6);
    expect(informationGain('entropy', countsBy('outlook'))).toBeCloseTo(0.24675, 5);
    expect(Math.abs(informationGain('entropy', countsBy('humidity')) - 0.151)).toBeLessThanOrEqual(0.001);
    expect(informationGain('entropy', countsBy('wind'))).toBeCloseTo(0.048, 3);
    expect(informationGain('entropy', countsBy('temperature'))).toBeCloseTo(0.029, 3);
  });

  // Mitchell (1997), ch. 3: the Sunny branch
  it('gives the gains under the Sunny branch', () => {
    const sunny = playTennis.filter((r) => r.outlook === 'Sunny');
    const by = (a: 'humidity' | 'temperature' | 'wind') => {
      const groups = new Map<string, [number, number]>();
      for (const row of sunny) {
        const part = groups.get(row[a]) ?? [0, 0];
        part[0] += 1;
        part[1] += row.play === 'Yes' ? 1 : 0;
        groups.set(row[a], part);
      }
      return [...groups.values()];
    };
    expect(entropy(5, 2)).toBeCloseTo(0.971, 3);
    expect(informationGain('entropy', by('humidity'))).toBeCloseTo(0.971, 3);
    expect(informationGain('entropy', by('temperature'))).toBeCloseTo(0.571, 3);
    expect(informationGain('entropy', by('wind'))).toBeCloseTo(0.02, 3);
  });

  // Han, Kamber & Pei, Data Mining (3rd ed.), §8.2.2; the Gini gains were computed (CHECKS.md)
  it('gives the Gini index of the 9 yes / 5 no example and the Gini gains', () => {
    expect(gini(14, 9)).toBeCloseTo(0.459, 3);
    expect(informationGain('gini', countsBy('outlook'))).toBeCloseTo(0.116327, 6);
    expect(informationGain('gini', countsBy('humidity'))).toBeCloseTo(0.091837, 6);
  });

  // Tan, Steinbach & Kumar, Introduction to Data Mining (2006), §4.3.4 (numbers from memory)
  it('gives the Gini of the textbook node counts', () => {
    expect(gini(6, 0)).toBe(0);
    expect(gini(6, 1)).toBeCloseTo(0.278, 3);
    expect(gini(6, 2)).toBeCloseTo(0.444, 3);
    expect(gini(6, 3)).toBeCloseTo(0.5, 3);
  });

  // Common practice, no source
  it('scores a 55/45 node at 0.495, a pure node at zero, and peaks at an even split', () => {
    expect(gini(100, 55)).toBeCloseTo(0.495, 10);
    expect(gini(10, 10)).toBe(0);
    expect(entropy(10, 0)).toBe(0);
    expect(entropy(10, 10)).toBe(0);
    expect(entropy(10, 5)).toBe(1);
    for (const p of [1, 2, 3, 4, 6, 7, 8, 9]) {
      expect(gini(10, p)).toBeLessThan(gini(10, 5));
      expect(entropy(10, p)).toBeLessThan(entropy(10, 5));
    }
  });

  // Common practice, no source: for 0/1 labels the Gini impurity is twice the variance
  it('equals twice the variance of 0/1 labels', () => {
    fc.assert(
      fc.property(fc.array(fc.boolean(), { minLength: 1, maxLength: 200 }), (labels) => {
        const ys: number[] = labels.map((b) => (b ? 1 : 0));
        const mean = ys.reduce((a, b) => a + b, 0) / ys.length;
        const variance = ys.reduce((a, y) => a + (y - mean) ** 2, 0) / ys.length;
        expect(gini(ys.length, ys.filter((y) => y === 1).length)).toBeCloseTo(2 * variance, 12);
      }),
    );
  });
});
