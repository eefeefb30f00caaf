import fc from 'fast-check';

/** A hostile JSON body, sent as raw text so keys like `__proto__` reach the server as written. */
export type HostileBody = { label: string; raw: string };

const wrongValues: unknown[] = [
  null,
  true,
  'a string',
  -1,
  1e308,
  1.5,
  [],
  {},
  [1, 2],
  { nested: { deeper: 1 } },
];

/**
 * Hand-made hostile variants of a valid body: each field with each wrong type (those the shared
 * schema refuses), missing fields,
 * an extra field, prototype-pollution keys at the top and one level down, bodies that are not
 * objects, and strings and arrays far beyond any sane size (but under the 1 MB body limit).
 */
export function hostileVariants(
  valid: Record<string, unknown>,
  isValid: (body: unknown) => boolean,
): HostileBody[] {
  const out: HostileBody[] = [];
  const json = (value: unknown) => JSON.stringify(value);
  for (const key of Object.keys(valid)) {
    for (const wrong of wrongValues) {
      if (isValid({ ...valid, [key]: wrong })) continue;
      out.push({ label: `${key} = ${json(wrong)}`, raw: json({ ...valid, [key]: wrong }) });
    }
    const { [key]: _dropped, ...without } = valid;
    if (!isValid(without)) out.push({ label: `without ${key}`, raw: json(without) });
    out.push({ label: `${key} as a huge string`, raw: json({ ...valid, [key]: 'x'.repeat(600_000) }) });
    out.push({
      label: `${key} as a huge array`,
      raw: json({ ...valid, [key]: Array.from({ length: 100_000 }, (_, i) => `f${i}`) }),
    });
  }
  const body = json(valid).slice(0, -1);
  out.push({ label: 'an extra field', raw: json({ ...valid, isAdmin: true }) });
  out.push({ label: '__proto__ key', raw: `${body},"__proto__":{"polluted":"yes"}}` });
  out.push({
    label: 'constructor.prototype key',
    raw: `${body},"constructor":{"prototype":{"polluted":"yes"}}}`,
  });
  out.push({ label: 'prototype key', raw: `${body},"prototype":{"polluted":"yes"}}` });
  for (const key of Object.keys(valid)) {
    if (valid[key] && typeof valid[key] === 'object' && !Array.isArray(valid[key])) {
      const inner = json(valid[key]).slice(0, -1);
      const sep = inner === '{' ? '' : ',';
      out.push({
        label: `__proto__ inside ${key}`,
        raw: json({ ...valid, [key]: '§' }).replace('"§"', `${inner}${sep}"__proto__":{"polluted":"yes"}}`),
      });
    }
  }
  for (const raw of ['[]', '"text"', 'null', '42', 'true', '{', '{"k":}'])
    out.push({ label: `body ${raw}`, raw });
  // An empty body reads as {}: hostile only where {} is not a valid body.
  if (!isValid({})) out.push({ label: 'an empty body', raw: '' });
  return out;
}

/** fast-check: the valid body with some fields replaced by arbitrary JSON values, kept when the shared schema refuses them. */
export function arbitraryWrongBody(
  valid: Record<string, unknown>,
  isValid: (body: unknown) => boolean,
): fc.Arbitrary<string> {
  const keys = Object.keys(valid);
  return fc
    .tuple(
      fc.subarray(keys, { minLength: 1 }),
      fc.array(fc.jsonValue({ maxDepth: 3 }), { minLength: keys.length, maxLength: keys.length }),
    )
    .map(([broken, values]) => {
      const body: Record<string, unknown> = { ...valid };
      broken.forEach((key, i) => {
        body[key] = values[i];
      });
      return JSON.stringify(body);
    })
    .filter((raw) => !isValid(JSON.parse(raw)));
}

/** True while no hostile body has reached Object.prototype in this process. */
export function prototypeClean(): boolean {
  const probe = {} as Record<string, unknown>;
  return probe.polluted === undefined && (Object.prototype as Record<string, unknown>).polluted === undefined;
}
