// The range editor's rows: every demo range's rules (site and inverter conditions included)
// go into the form and come back out as the same rules the shared contract accepts.
import { describe, expect, it } from 'vitest';
import { BomRuleSchema, BomRulesSchema } from '../../shared/domain/bom-rules.ts';
import type { RangeDetail } from '../../shared/contracts/stack-plans.ts';
import { conditionOfKind, formValuesOf, CONDITION_LABELS, type ConditionKind } from '../../src/features/planner/components/range-form-values.ts';
import { demoRange, demoRangeCodes } from '../support/demo-planner.ts';

function detailOf(code: string): RangeDetail {
  const range = demoRange(code);
  return { ...({} as RangeDetail), name: range.name, connection: range.connection, controllerSku: range.controller.sku, moduleSku: range.module.sku, minModules: range.minModules, maxModules: range.maxModules, maxStacks: range.maxStacks, baseHeightMm: range.baseHeightMm, defaultDodPct: range.defaultDodPct ?? null, inverterSkus: range.inverterSkus ?? [], rules: range.rules };
}

describe('range form values', () => {
  it('round-trips every demo range’s rules', () => {
    for (const code of demoRangeCodes) {
      const rules = demoRange(code).rules;
      expect(BomRulesSchema.parse(formValuesOf(detailOf(code)).rules), code).toEqual(rules);
    }
  });

  it('starts every condition kind valid, so switching kind never leaves a broken row', () => {
    for (const kind of Object.keys(CONDITION_LABELS) as ConditionKind[]) {
      const parsed = BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1, when: conditionOfKind(kind) });
      expect(parsed.error?.issues ?? [], kind).toEqual([]);
    }
  });
});
