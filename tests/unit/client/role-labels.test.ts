import { describe, expect, it } from 'vitest';
import { can, ROLE_LABELS, ROLE_ORDER, roleLabel, roleSchema } from '../../../src/features/auth';

describe('role labels', () => {
  it('shows each API role in words', () => {
    expect(roleLabel('chief_scientist')).toBe('Chief scientist');
    expect(roleLabel('technician')).toBe('Technician');
    expect(roleLabel('analyst')).toBe('Analyst');
    expect(roleLabel('pi')).toBe('Principal investigator');
  });

  it('has a label and a picker position for exactly the roles the API knows', () => {
    expect(Object.keys(ROLE_LABELS).sort()).toEqual([...roleSchema.options].sort());
    expect([...ROLE_ORDER].sort()).toEqual([...roleSchema.options].sort());
  });

  it('refuses a role the API does not define', () => {
    expect(roleSchema.safeParse('captain').success).toBe(false);
  });

  it('lets only the chief scientist manage the team and plan stations', () => {
    for (const role of roleSchema.options) {
      expect(can.manageTeam(role)).toBe(role === 'chief_scientist');
      expect(can.planStations(role)).toBe(role === 'chief_scientist');
    }
    expect(can.uploadCasts('technician')).toBe(true);
    expect(can.uploadCasts('analyst')).toBe(false);
    expect(can.manageTeam(null)).toBe(false);
  });
});
