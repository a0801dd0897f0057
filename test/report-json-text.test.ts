/** jsonText: the JSON of every output file (RFC 8259 has no NaN or Infinity: they are written as null). */
import { describe, it, expect } from 'vitest';
import { jsonText } from '../src/report/build-summary.js';

describe('jsonText', () => {
  it('writes 2-space JSON with a final newline, non-finite numbers as null, that parses back', () => {
    const text = jsonText({ a: [1.5, NaN, Infinity, -Infinity, -0], b: { c: 'x' } });
    expect(text.endsWith('}\n')).toBe(true);
    expect(text).toContain('\n  "b": {\n    "c": "x"\n  }');
    expect(JSON.parse(text)).toEqual({ a: [1.5, null, null, null, 0], b: { c: 'x' } });
  });
});
