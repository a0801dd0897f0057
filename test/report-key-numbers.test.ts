/** keyNumbers / verdictOf / formatNumber: the numbers both report.html and the terminal print. */
import { describe, expect, it } from 'vitest';
import { keyNumbers, verdictOf } from '../src/report/key-numbers.js';
import { formatNumber } from '../src/report/format-number.js';
import type { Summary } from '../src/report/summary-types.js';
import { fixtureSummary } from './helpers/make-preview.js';

function valueAt(s: Summary, key: string): unknown {
  const [block, name] = key.split('.');
  return (s as unknown as Record<string, Record<string, unknown>>)[block]?.[name];
}

describe('formatNumber', () => {
  it('reads n/a for missing and non-finite values', () => {
    expect(formatNumber(null)).toBe('n/a');
    expect(formatNumber(undefined)).toBe('n/a');
    expect(formatNumber(Number.NaN)).toBe('n/a');
    expect(formatNumber(Infinity)).toBe('n/a');
  });
  it('prints integers in full and zero as 0', () => {
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(256)).toBe('256');
    expect(formatNumber(-3)).toBe('-3');
  });
  it('keeps 3 significant figures: parsing back is within half a unit of the third figure', () => {
    for (const x of [1.23456e-18, 0.0123456, 0.98765, 3.14159, 12.345, 999.51, 12345.6, 1.5e7, -2.71828]) {
      const back = Number(formatNumber(x));
      expect(Math.abs(back - x) / Math.abs(x)).toBeLessThanOrEqual(0.005);
      // three significant digits in the mantissa
      const digits = formatNumber(x).replace(/^-/, '').replace(/e.*$/, '').replace('.', '').replace(/^0+/, '');
      expect(digits.length).toBe(3);
    }
  });
});

describe('keyNumbers', () => {
  it('gives every listed summary value, parsed back within 3 significant figures', () => {
    const s = fixtureSummary();
    const rows = keyNumbers(s);
    expect(rows.length).toBeGreaterThan(20);
    for (const r of rows) {
      const v = valueAt(s, r.key);
      if (v === null) {
        expect(r.value).toBe('n/a');
        continue;
      }
      expect(typeof v).toBe('number');
      const shown = Number(r.value);
      if (Number.isInteger(v)) expect(shown).toBe(v);
      else expect(Math.abs(shown - (v as number)) / Math.abs(v as number)).toBeLessThanOrEqual(0.005);
    }
  });

  it('names the Jeans-mass convention and carries units', () => {
    const rows = keyNumbers(fixtureSummary());
    expect(rows.find((r) => r.key === 'cloud.jeans_mass_msun')?.label).toBe('Jeans mass (sphere)');
    expect(rows.find((r) => r.key === 'cloud.mass_msun')?.unit).toBe('Msun');
    expect(rows.find((r) => r.key === 'resolution.max_resolved_density_gcc')?.unit).toBe('g cm^-3');
  });

  it('leaves out missing blocks and keys, and non-numeric values', () => {
    const s = fixtureSummary();
    delete s.cloud;
    delete s.resolution;
    delete s.cost;
    s.hierarchy = { nodes: 0, fragment_candidates: 0, cmf_slope: 'none' };
    const rows = keyNumbers(s);
    expect(rows.map((r) => r.key)).toEqual(['grid.cells_per_side', 'grid.box_size_pc', 'grid.cell_size_pc', 'grid.mass_on_grid_msun', 'hierarchy.nodes', 'hierarchy.fragment_candidates']);
  });
});

describe('keyNumbers null values', () => {
  it('code-specific keys with null are left out; other nulls read n/a', () => {
    const s = fixtureSummary();
    s.resolution = { ...s.resolution, particles_needed: null, levels_needed: null };
    const keys = keyNumbers(s).map((r) => r.key);
    expect(keys).not.toContain('resolution.particles_needed');
    expect(keys).not.toContain('resolution.levels_needed');
    expect(keyNumbers(s).find((r) => r.key === 'hierarchy.cmf_slope')?.value).toBe('n/a');
  });
});

describe('verdictOf', () => {
  it('reads the string form with verdict_reason, the object form, and nothing', () => {
    const s = fixtureSummary();
    expect(verdictOf(s)).toEqual({ status: 'not resolved', reason: String(s.resolution?.verdict_reason) });
    s.resolution = { verdict: { status: 'resolved', reason: 'ok' } };
    expect(verdictOf(s)).toEqual({ status: 'resolved', reason: 'ok' });
    delete s.resolution;
    expect(verdictOf(s)).toBeNull();
  });
});
