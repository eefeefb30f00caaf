import type { ExcludedFeature } from '../../../../shared/models';

/** What the rules need to know of a candidate feature column (the intake's engine columns fit). */
export type FeatureFacts = {
  name: string;
  /** the characteristic the intake profile flags the column (or its source) with, e.g. 'age' */
  protectedCharacteristic?: string | null;
  /** for a derived column: the file column it comes from (an age from a date of birth) */
  derivedFrom?: string;
};

/** A column of the file as the intake profiled it (including columns that are not features). */
export type ProfiledColumn = { name: string; protectedCharacteristic?: { characteristic: string } | null };

function words(text: string): string[] {
  return text
    .toLowerCase()
    .split(/[^\p{L}\p{N}]+/u)
    .filter(Boolean);
}

function containsWords(haystack: string[], needle: string[]): boolean {
  if (needle.length === 0 || needle.length > haystack.length) return false;
  for (let i = 0; i + needle.length <= haystack.length; i++) {
    if (needle.every((w, j) => haystack[i + j] === w)) return true;
  }
  return false;
}

/**
 * Why a column may not be a feature under the blocked fields, or null when it may. A column is
 * blocked when
 * - its name is a blocked field's, or contains it as whole words ("Age band (Date of Birth)",
 *   "Gender identity" for "Gender"; whole words, so "Wage" does not match "Age");
 * - it is derived from a blocked field (the intake turns a date of birth into an age);
 * - the intake profile flags it with the same protected characteristic as a blocked field, or
 *   with the characteristic a blocked field names: a derivative under another name ("Age band"
 *   when "Date of Birth" is blocked, "Sex" when "Gender" is) carries the same information.
 */
export function blockedReason(
  feature: FeatureFacts,
  blockedFields: readonly string[],
  profile: readonly ProfiledColumn[] = [],
): string | null {
  const name = words(feature.name);
  const characteristicOf = (column: string) =>
    profile.find((p) => p.name === column)?.protectedCharacteristic?.characteristic ?? null;
  const own = feature.protectedCharacteristic ?? characteristicOf(feature.name);
  for (const blocked of blockedFields) {
    const blockedWords = words(blocked);
    if (containsWords(name, blockedWords)) {
      return name.length === blockedWords.length
        ? `"${blocked}" is a blocked field in the privacy policy`
        : `its name contains the blocked field "${blocked}"`;
    }
    if (feature.derivedFrom && containsWords(words(feature.derivedFrom), blockedWords)) {
      return `derived from the blocked field "${blocked}"`;
    }
    const blockedCharacteristic = characteristicOf(blocked);
    if (own && (own === blockedCharacteristic || containsWords(blockedWords, words(own)))) {
      return `flagged as ${own}, like the blocked field "${blocked}"`;
    }
  }
  return null;
}

/**
 * Splits the dataset's feature columns into those the engine may use and those it may not,
 * with the reason for each. `requested` (the analyst's choice) narrows the allowed ones; a
 * requested column that does not exist is reported in `unknown`.
 */
export function selectFeatures(
  candidates: readonly FeatureFacts[],
  blockedFields: readonly string[],
  options: {
    requested?: readonly string[] | null;
    profile?: readonly ProfiledColumn[];
    /** columns blocked for this dataset only (proxies the privacy officer blocked): column → why */
    blockedProxies?: Readonly<Record<string, string>>;
  } = {},
): { allowed: string[]; excluded: ExcludedFeature[]; unknown: string[] } {
  const allowed: string[] = [];
  const excluded: ExcludedFeature[] = [];
  const requested = options.requested ? new Set(options.requested) : null;
  for (const feature of candidates) {
    const reason =
      blockedReason(feature, blockedFields, options.profile) ??
      options.blockedProxies?.[feature.name] ??
      null;
    if (reason) excluded.push({ name: feature.name, reason });
    else if (requested && !requested.has(feature.name))
      excluded.push({ name: feature.name, reason: 'not chosen for this run' });
    else allowed.push(feature.name);
  }
  const known = new Set(candidates.map((c) => c.name));
  const unknown = requested ? [...requested].filter((name) => !known.has(name)) : [];
  return { allowed, excluded, unknown };
}
