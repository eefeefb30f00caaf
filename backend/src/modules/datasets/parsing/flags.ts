import type { ColumnProfile, DirectIdentifierKind } from '../../../../../shared/datasets';
import type { TypedColumn } from './type-columns';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
export const MANAGER_HEADER = /manager|supervisor|team ?lead|line ?lead|reports? ?to/i;
const NAME_HEADER = /\bname\b|surname|forename/i;
const ORG_WORDS =
  /team|crew|depot|department|dept|site|region|role|job|unit|company|location|branch|project|course|org|division|area|file|sheet/i;
const PHONE_HEADER = /phone|mobile|telephone|\btel\b|\bcell\b/i;
const NATIONAL_ID_HEADER =
  /national ?insurance|\bni ?(no|number)\b|\bnino\b|\bssn\b|social ?security|passport|national ?id|tax ?(id|number|code)|\bsin\b|\btfn\b/i;
// UK National Insurance number and US Social Security number patterns.
const NATIONAL_ID_VALUE = /^([A-CEGHJ-PR-TW-Z]{2} ?\d{2} ?\d{2} ?\d{2} ?[A-D]|\d{3}-\d{2}-\d{4})$/i;

// Value-based flags look at an evenly spaced sample: enough to recognise a column's kind.
const SAMPLE = 2000;

function shareMatching(column: TypedColumn, test: (text: string) => boolean): number {
  const step = Math.max(1, Math.floor(column.values.length / SAMPLE));
  let present = 0;
  let matching = 0;
  for (let i = 0; i < column.values.length; i += step) {
    const value = column.values[i];
    if (value === null || typeof value !== 'string') continue;
    present += 1;
    if (test(value)) matching += 1;
  }
  return present === 0 ? 0 : matching / present;
}

function isPhone(text: string): boolean {
  if (!/^\+?[\d\s().-]{7,22}$/.test(text)) return false;
  const digits = text.replace(/\D/g, '').length;
  return digits >= 9 && digits <= 15 && (/[\s+().-]/.test(text) || text.startsWith('0'));
}

function looksLikePersonName(text: string): boolean {
  return /^\p{Lu}[\p{L}'’-]+(\s+\p{Lu}[\p{L}'’.-]*){1,3}$/u.test(text);
}

/**
 * Direct identifiers (dropped before storage): names, e-mail addresses other than the manager's,
 * phone numbers and national ID numbers, recognised by header and by values.
 */
export function detectDirectIdentifier(
  column: TypedColumn,
): { kind: DirectIdentifierKind; reason: string } | null {
  const { name } = column;
  if (column.type === 'date' || column.type === 'yes-no') return null;
  if (column.type === 'number') {
    // Only the header can tell: a phone number saved as a number cell has lost its formatting.
    if (NATIONAL_ID_HEADER.test(name))
      return { kind: 'national-id', reason: 'national ID numbers identify a person directly' };
    if (PHONE_HEADER.test(name)) return { kind: 'phone', reason: 'phone numbers identify a person directly' };
    return null;
  }
  if (NATIONAL_ID_HEADER.test(name) || shareMatching(column, (t) => NATIONAL_ID_VALUE.test(t)) >= 0.5) {
    return { kind: 'national-id', reason: 'national ID numbers identify a person directly' };
  }
  const emails = shareMatching(column, (t) => EMAIL.test(t));
  if ((emails >= 0.5 || /e-?mail/i.test(name)) && !MANAGER_HEADER.test(name)) {
    return { kind: 'email', reason: 'e-mail addresses identify a person directly' };
  }
  if (PHONE_HEADER.test(name) || shareMatching(column, isPhone) >= 0.8) {
    return { kind: 'phone', reason: 'phone numbers identify a person directly' };
  }
  const nameHeader = NAME_HEADER.test(name) && !ORG_WORDS.test(name);
  if (nameHeader || (column.type !== 'category' && shareMatching(column, looksLikePersonName) >= 0.8)) {
    return { kind: 'name', reason: "people's names identify them directly" };
  }
  return null;
}

type ProtectedRule = {
  characteristic: string;
  legalBasis: string;
  header: RegExp;
  /** lower-case values that give the characteristic away even under another header */
  values?: string[];
};

// Legal lists: UK Equality Act 2010 s.4, EU GDPR Art. 9(1), US Title VII, Pregnancy Discrimination
// Act, ADEA, ADA, GINA (see the checks document beside the API contract).
const PROTECTED: ProtectedRule[] = [
  {
    characteristic: 'gender reassignment',
    legalBasis: 'UK Equality Act 2010 s.4: gender reassignment',
    header: /gender ?reassignment|transgender|\btrans\b|gender ?identity/i,
  },
  {
    characteristic: 'sexual orientation',
    legalBasis:
      'UK Equality Act 2010 s.4: sexual orientation; GDPR Art. 9(1): sex life or sexual orientation',
    header: /sexual|orientation/i,
  },
  {
    characteristic: 'age',
    legalBasis: 'UK Equality Act 2010 s.4: age; US ADEA: age 40 and over',
    header: /birth|\bdob\b|\bage\b|age ?band|age ?group/i,
  },
  {
    characteristic: 'sex',
    legalBasis: 'UK Equality Act 2010 s.4: sex; US Title VII: sex',
    header: /\bsex\b|gender/i,
    values: ['male', 'female', 'm', 'f', 'man', 'woman', 'non-binary', 'prefer not to say', 'other'],
  },
  {
    characteristic: 'race or ethnic origin',
    legalBasis:
      'UK Equality Act 2010 s.4: race; GDPR Art. 9(1): racial or ethnic origin; US Title VII: race, colour, national origin',
    header: /ethnic|\brace\b|colou?r of skin|skin colou?r/i,
    values: [
      'white british',
      'white other',
      'asian',
      'black',
      'mixed',
      'asian british',
      'black british',
      'white',
    ],
  },
  {
    characteristic: 'nationality or national origin',
    legalBasis: 'UK Equality Act 2010 s.4: race (includes nationality); US Title VII: national origin',
    header: /nationality|citizenship|country ?of ?birth|national ?origin/i,
  },
  {
    characteristic: 'religion or belief',
    legalBasis:
      'UK Equality Act 2010 s.4: religion or belief; GDPR Art. 9(1): religious or philosophical beliefs; US Title VII: religion',
    header: /religio|belief|faith/i,
    values: ['christian', 'muslim', 'hindu', 'jewish', 'sikh', 'buddhist', 'no religion'],
  },
  {
    characteristic: 'disability or health',
    legalBasis: 'UK Equality Act 2010 s.4: disability; GDPR Art. 9(1): health; US ADA',
    header: /disab|health|medical|impairment|long.?term ?condition/i,
  },
  {
    characteristic: 'marriage or civil partnership',
    legalBasis: 'UK Equality Act 2010 s.4: marriage and civil partnership',
    header: /marital|married|civil ?partner/i,
    values: ['single', 'married', 'divorced', 'widowed', 'civil partnership', 'separated'],
  },
  {
    characteristic: 'pregnancy or maternity',
    legalBasis: 'UK Equality Act 2010 s.4: pregnancy and maternity; US Pregnancy Discrimination Act',
    header: /pregnan|maternity|paternity|parental ?leave/i,
  },
  {
    characteristic: 'trade-union membership',
    legalBasis: 'GDPR Art. 9(1): trade-union membership',
    header: /trade ?union|union ?member/i,
  },
  {
    characteristic: 'political opinions',
    legalBasis: 'GDPR Art. 9(1): political opinions',
    header: /politic/i,
  },
  {
    characteristic: 'genetic data',
    legalBasis: 'GDPR Art. 9(1): genetic data; US GINA',
    header: /genetic/i,
  },
];

/** Likely protected characteristics, by header and by values; suggested to the privacy officer as blocked. */
export function detectProtectedCharacteristic(
  column: TypedColumn,
): { characteristic: string; legalBasis: string } | null {
  for (const rule of PROTECTED) {
    if (rule.header.test(column.name))
      return { characteristic: rule.characteristic, legalBasis: rule.legalBasis };
  }
  if (column.type !== 'category') return null;
  const values = new Set<string>();
  for (const value of column.values) if (typeof value === 'string') values.add(value);
  const distinct = new Set<string>();
  for (const value of values) distinct.add(value.toLowerCase());
  for (const rule of PROTECTED) {
    if (!rule.values) continue;
    const known = [...distinct].filter((value) => rule.values?.includes(value)).length;
    if (distinct.size >= 2 && known >= 2 && known >= 0.6 * distinct.size) {
      return { characteristic: rule.characteristic, legalBasis: rule.legalBasis };
    }
  }
  return null;
}

export function flagColumn(
  column: TypedColumn,
): Pick<ColumnProfile, 'directIdentifier' | 'protectedCharacteristic'> {
  const flags: Pick<ColumnProfile, 'directIdentifier' | 'protectedCharacteristic'> = {};
  const direct = detectDirectIdentifier(column);
  if (direct) flags.directIdentifier = direct;
  const protectedCharacteristic = detectProtectedCharacteristic(column);
  if (protectedCharacteristic) flags.protectedCharacteristic = protectedCharacteristic;
  return flags;
}
