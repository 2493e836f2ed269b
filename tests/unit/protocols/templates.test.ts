import { describe, expect, it } from 'vitest';
import {
  findProcedureTemplate,
  procedureTemplates,
  recalledMark,
  resolveProcedure,
  validateProcedure,
} from '@/protocols';
import { inventedCell, prismaticLcoCell } from '@/scenarios/invented-cells';

describe('built-in procedure templates', () => {
  it('has eight templates with distinct keys and codes', () => {
    expect(procedureTemplates.map((template) => template.key)).toEqual([
      'rated-capacity-20c',
      'rate-capability',
      'dc-resistance',
      'ac-resistance',
      'discharge-at-minus-20c',
      'charge-retention',
      'observation-before-after',
      'endurance-in-cycles',
    ]);
    expect(new Set(procedureTemplates.map((template) => template.procedure.header.code)).size).toBe(8);
    expect(findProcedureTemplate('dc-resistance')?.procedure.header.title).toBe('DC internal resistance');
    expect(findProcedureTemplate('no-such-template')).toBeUndefined();
  });

  it.each(procedureTemplates.map((template) => [template.key, template] as const))(
    '%s passes the procedure schema unchanged',
    (_key, template) => {
      expect(validateProcedure(template.procedure)).toEqual({ ok: true, value: template.procedure });
    },
  );

  it.each(procedureTemplates.map((template) => [template.key, template] as const))(
    '%s resolves without errors against a typical 3 000 mAh NMC cylindrical cell',
    (_key, template) => {
      const result = resolveProcedure({ procedure: template.procedure, cellSpecification: inventedCell });
      expect(result.ok).toBe(true);
      if (!result.ok) return;
      expect(result.resolution.errors).toEqual([]);
      const setPoints = result.resolution.steps.flatMap((step) => Object.values(step));
      expect(setPoints).not.toContain(null);
    },
  );

  it('asks for an acknowledgement only for the −20 °C soak', () => {
    const needing = procedureTemplates.flatMap((template) => {
      const result = resolveProcedure({ procedure: template.procedure, cellSpecification: inventedCell });
      return result.ok ? result.resolution.cautionsNeedingAcknowledgement : ['invalid'];
    });
    expect(needing).toEqual(['soak-below-zero-celsius/cold-soak/temperature']);
  });

  it('names the specification fields a cell lacks instead of failing (prismatic cell without termination current)', () => {
    const template = findProcedureTemplate('ac-resistance')!;
    const result = resolveProcedure({ procedure: template.procedure, cellSpecification: prismaticLcoCell });
    expect(result.ok && result.resolution.errors.map((error) => error.path)).toEqual([
      'steps.0.termination.current',
      'acceptance.0.atMost',
    ]);
  });

  it.each(procedureTemplates.map((template) => [template.key, template] as const))(
    '%s marks at least one value "recalled, verify against the standard" and cites a clause',
    (_key, template) => {
      const notes = template.procedure.header.notes ?? [];
      expect(notes.some((note) => note.includes(recalledMark))).toBe(true);
      // Every template cites IEC 61960-3:2017 clause 7.x, except the observation template, which cites UN 38.3.4.
      const { standard, clause } = template.procedure.header;
      expect(`${standard} ${clause}`).toMatch(/^(IEC 61960-3:2017 7\.|UN Manual of Tests and Criteria 38\.3\.4 )/);
    },
  );
});
