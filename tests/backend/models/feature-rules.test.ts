import { describe, expect, it } from 'vitest';
import { blockedReason, selectFeatures } from '../../../backend/src/modules/models/feature-rules';

// Column names as the intake hands them over: an age derived from a date of birth keeps its source.
const candidates = [
  { name: 'Weekly Overtime Hours', protectedCharacteristic: null },
  { name: 'Age (years)', protectedCharacteristic: 'age', derivedFrom: 'Date of Birth' },
  { name: 'Age Band', protectedCharacteristic: 'age' },
  { name: 'Date of Birth Year', protectedCharacteristic: 'age' },
  { name: 'Wage Band', protectedCharacteristic: null },
  { name: 'Sex', protectedCharacteristic: 'sex' },
  { name: 'Years Since Qualification', protectedCharacteristic: null },
];
const profile = [
  { name: 'Date of Birth', protectedCharacteristic: { characteristic: 'age' } },
  { name: 'Gender', protectedCharacteristic: { characteristic: 'sex' } },
];

describe('which columns may be features', () => {
  it('keeps a blocked field and everything derived from it out of the features, saying why', () => {
    const { allowed, excluded } = selectFeatures(candidates, ['Date of Birth'], { profile });
    expect(allowed).toEqual(['Weekly Overtime Hours', 'Wage Band', 'Sex', 'Years Since Qualification']);
    expect(excluded).toEqual([
      { name: 'Age (years)', reason: 'derived from the blocked field "Date of Birth"' },
      { name: 'Age Band', reason: 'flagged as age, like the blocked field "Date of Birth"' },
      { name: 'Date of Birth Year', reason: 'its name contains the blocked field "Date of Birth"' },
    ]);
  });

  it('blocks a column flagged with the same characteristic under another name ("Sex" when "Gender" is blocked)', () => {
    expect(blockedReason({ name: 'Sex', protectedCharacteristic: 'sex' }, ['Gender'], profile)).toMatch(
      /flagged as sex/,
    );
  });

  it('matches whole words, so a blocked "Age" does not block "Wage Band" or "Average Overtime"', () => {
    expect(blockedReason({ name: 'Wage Band' }, ['Age'])).toBeNull();
    expect(blockedReason({ name: 'Average Overtime' }, ['Age'])).toBeNull();
    expect(blockedReason({ name: 'age band' }, ['Age'])).toMatch(/contains the blocked field "Age"/);
    expect(blockedReason({ name: 'Age Band', protectedCharacteristic: 'age' }, ['age'])).not.toBeNull();
  });

  it('narrows to the columns the analyst chose, and names a chosen column that does not exist', () => {
    const { allowed, unknown, excluded } = selectFeatures(candidates, ['Gender'], {
      profile,
      requested: ['Weekly Overtime Hours', 'Sex', 'Shift Pattern'],
    });
    expect(allowed).toEqual(['Weekly Overtime Hours']);
    expect(unknown).toEqual(['Shift Pattern']);
    expect(excluded.find((e) => e.name === 'Sex')?.reason).toMatch(/Gender/);
    expect(excluded.find((e) => e.name === 'Wage Band')?.reason).toBe('not chosen for this run');
  });
});
