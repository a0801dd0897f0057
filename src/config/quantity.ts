/** Zod schemas for quantities with units; every value is converted to cgs on parse. */
import { z } from 'zod';
import { parseQuantity, UnitError, type DimensionName, exampleFor } from '../physics/units.js';

/**
 * A quantity given as "value unit" or a bare number in `defaultUnit`, parsed to cgs.
 * Example: quantity('length', 'pc') parses "1.2 pc" and 1.2 alike to 3.703e18 cm.
 */
export function quantity(dim: DimensionName, defaultUnit: string, opts: { positive?: boolean; nonNegative?: boolean } = { positive: true }) {
  return z.union([z.number(), z.string()], { error: `expected a quantity like "${exampleFor(dim)}" or a number in ${defaultUnit}` }).transform((v, ctx) => {
    try {
      const x = parseQuantity(v, dim, defaultUnit);
      if (opts.positive && !(x > 0)) {
        ctx.addIssue({ code: 'custom', message: `expected a positive value, got ${JSON.stringify(v)}` });
        return z.NEVER;
      }
      if (opts.nonNegative && !(x >= 0)) {
        ctx.addIssue({ code: 'custom', message: `expected a value >= 0, got ${JSON.stringify(v)}` });
        return z.NEVER;
      }
      return x;
    } catch (e) {
      ctx.addIssue({ code: 'custom', message: e instanceof UnitError ? e.message : String(e) });
      return z.NEVER;
    }
  });
}
