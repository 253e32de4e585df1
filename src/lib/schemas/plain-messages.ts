import { z } from 'zod';

// Zod's own messages read as a parser's ("Invalid input: expected string, received undefined").
// This map says the same in words and names the field; a schema's own message still wins.

const UNITS: Record<string, string> = {
  M: 'm', Mm: 'mm', Km: 'km', A: 'A', Ka: 'kA', V: 'V', Kv: 'kV', Ohm: 'Ω', OhmM: 'Ω·m', OhmPerKm: 'Ω/km',
  S: 's', Ms: 'ms', Pct: '%', Hz: 'Hz', Kj: 'kJ', J: 'J', C: '°C', Deg: '°',
};

/** `lengthM` → "Length (m)", `soilResistivityOhmM` → "Soil resistivity (Ω·m)", `code` → "Code". */
export function fieldWords(path: readonly PropertyKey[]): string {
  const key = [...path].reverse().find((p): p is string => typeof p === 'string');
  if (!key) return 'This value';
  const unit = Object.keys(UNITS)
    .sort((a, b) => b.length - a.length)
    .find((u) => key.endsWith(u) && key.length > u.length && /[a-z]/.test(key[key.length - u.length - 1]));
  const stem = unit ? key.slice(0, -unit.length) : key;
  const words = stem.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
  return `${words.charAt(0).toUpperCase()}${words.slice(1)}${unit ? ` (${UNITS[unit]})` : ''}`;
}

const KIND_WORDS: Record<string, string> = { string: 'text', number: 'a number', int: 'a whole number', boolean: 'yes or no (true/false)', array: 'a list', object: 'a group of fields', date: 'a date' };

function bound(origin: string, limit: unknown, inclusive: boolean | undefined, least: boolean): string {
  const n = typeof limit === 'bigint' ? Number(limit) : (limit as number);
  if (origin === 'string') return `${least ? 'at least' : 'at most'} ${n} character${n === 1 ? '' : 's'}`;
  if (origin === 'array' || origin === 'set') return `${least ? 'at least' : 'at most'} ${n} entr${n === 1 ? 'y' : 'ies'}`;
  if (least) return inclusive === false ? `greater than ${n}` : `at least ${n}`;
  return inclusive === false ? `less than ${n}` : `at most ${n}`;
}

export const plainMessage: z.core.$ZodErrorMap = (iss) => {
  const name = fieldWords(iss.path ?? []);
  switch (iss.code) {
    case 'invalid_type':
      if (iss.input === undefined) return `${name} is required.`;
      return `${name} must be ${KIND_WORDS[iss.expected] ?? iss.expected}.`;
    case 'too_small':
      if (iss.origin === 'string' && iss.minimum === 1) return `${name} must not be empty.`;
      if (iss.origin === 'array' || iss.origin === 'set') return `${name} needs ${bound(iss.origin, iss.minimum, iss.inclusive, true)}.`;
      return `${name} must be ${bound(iss.origin, iss.minimum, iss.inclusive, true)}.`;
    case 'too_big':
      if (iss.origin === 'array' || iss.origin === 'set') return `${name} allows ${bound(iss.origin, iss.maximum, iss.inclusive, false)}.`;
      return `${name} must be ${bound(iss.origin, iss.maximum, iss.inclusive, false)}.`;
    case 'invalid_value':
      return `${name} must be one of: ${iss.values.map((v) => String(v)).join(', ')}.`;
    case 'invalid_format':
      return `${name} is not a valid ${iss.format === 'uuid' || iss.format === 'guid' ? 'identifier' : iss.format === 'email' ? 'e-mail address' : iss.format}.`;
    case 'not_multiple_of':
      return `${name} must be a multiple of ${String(iss.divisor)}.`;
    case 'unrecognized_keys':
      return `Unknown field${iss.keys.length > 1 ? 's' : ''} ${iss.keys.map((k) => `"${k}"`).join(', ')}: check the spelling.`;
    case 'invalid_union':
      return `${name} does not match any of the accepted forms.`;
    default:
      return undefined;
  }
};

// In the browser, also skip zod's `new Function` probe, which the CSP (no 'unsafe-eval') refuses
// with a policy report; every island that parses imports a schema module, and so this one.
z.config({ customError: plainMessage, ...(typeof document === 'undefined' ? {} : { jitless: true }) });
