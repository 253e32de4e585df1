import { describe, expect, it } from 'vitest';
import { unstorableText } from '../../../src/lib/server/storable-text';

describe('text the database cannot store is refused by field', () => {
  it.each([
    ['U+0000 in a value', { body: 'a\u0000b' }, 'body'],
    ['a lone high surrogate', { inputs: { title: 'x\uD800' } }, 'inputs.title'],
    ['a lone low surrogate in an array', { rows: ['ok', '\uDC00y'] }, 'rows.1'],
    ['U+0000 in a key', { inputs: { 'a\u0000': 1 } }, 'inputs'],
  ])('%s', (_label, body, field) => {
    expect(unstorableText(body).map((f) => f.field)).toEqual([field]);
  });

  it('accepts ordinary text, emoji (a valid surrogate pair), U+FFFF and other controls', () => {
    expect(unstorableText({ a: 'Ω 😀 \uFFFF \u0001', b: [1, null, true], c: { d: 'é' } })).toEqual([]);
  });
});
