/** The family form keeps what the balance check reads: a family saved through it keeps its rotor mass. */
import { describe, expect, it } from 'vitest';
import { toForm, toSpec } from '~/components/catalog/FamilyForm';
import { demoFamilies } from '~/lib/domain/demo-catalog';
import { machineFamilySchema } from '~/lib/domain/schemas';

describe('family form', () => {
  it('round-trips every demo family, rotor mass included', () => {
    for (const family of demoFamilies) {
      const spec = machineFamilySchema.parse(toSpec(toForm(family)));
      expect(spec.rotorMassKg).toBe(family.rotorMassKg);
      expect(spec.rotorBarPlaces).toEqual(family.rotorBarPlaces);
    }
  });

  it('leaves the rotor mass out when the field is blank, and refuses a mass the schema does not take', () => {
    const form = toForm(demoFamilies[0]!);
    expect(toSpec({ ...form, rotorMassKg: ' ' })).not.toHaveProperty('rotorMassKg');
    expect(machineFamilySchema.safeParse(toSpec({ ...form, rotorMassKg: '5' })).success).toBe(false);
  });
});
