import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { labelOf, problemsMessage, problemsOf, withLabel } from '../../../shared/schemas/problems';
import { createProcedureBody } from '../../../shared/schemas/procedures';
import { unitBody } from '../../../shared/schemas/units';
import { inviteBody } from '../../../shared/schemas/people';
import { abandonBody, handoverBody, startRunBody } from '../../../shared/schemas/runs';
import { changePasswordBody, signInBody } from '../../../shared/schemas/auth';

const reasons = (schema: z.ZodType, value: unknown, where?: string) => {
  const parsed = schema.safeParse(value);
  expect(parsed.success).toBe(false);
  return problemsOf(schema, parsed.error!.issues, where);
};

/** zod's own English: none of it may reach a person. */
const ZOD_WORDS =
  /Invalid input|expected string|received undefined|Too small|Too big|Invalid option|Invalid UUID/;

describe('validation problems name the field as its form labels it', () => {
  it('a missing field of a shared request schema: "Model is required", path kept for machines', () => {
    const problems = reasons(unitBody, { serial: 'A1' }, 'body');
    expect(problems).toEqual([{ field: 'body.model', label: 'Model', reason: 'Model is required' }]);
  });

  it('an empty or too long field, by its label', () => {
    const problems = reasons(createProcedureBody, {
      title: 'x',
      equipmentFamily: '',
      equipmentModel: 'M'.repeat(81),
      tags: ['ok', ''],
    });
    expect(problems.map((p) => p.reason)).toEqual([
      'Title must be at least 3 characters',
      'Equipment family is required',
      'Model must be at most 80 characters',
      'Tag 2 is required',
    ]);
  });

  it('wrong type, a value outside a list (options in words), a bad format', () => {
    const schema = z.object({
      count: z.number().int().min(1).meta({ title: 'How many' }),
      state: z.enum(['in_review', 'approved']).meta({ title: 'State' }),
      mail: z.email().meta({ title: 'E-mail' }),
    });
    const problems = reasons(schema, { count: 'three', state: 'lost', mail: 'nobody' });
    expect(problems.map((p) => p.reason)).toEqual([
      'How many must be a number',
      'State must be one of “in review” or “approved”',
      'E-mail is not a valid e-mail address',
    ]);
    for (const p of problems) expect(p.reason).not.toMatch(ZOD_WORDS);
  });

  it('numbers too small and too large, lists too short', () => {
    const schema = z.object({
      volts: z.number().min(50).max(300).meta({ title: 'Mains voltage' }),
      roles: z.array(z.string()).min(1).meta({ title: 'Roles' }),
    });
    expect(reasons(schema, { volts: 10, roles: [] }).map((p) => p.reason)).toEqual([
      'Mains voltage must be at least 50',
      'Roles needs at least 1 entry',
    ]);
    expect(reasons(schema, { volts: 400, roles: ['a'] })[0]!.reason).toBe(
      'Mains voltage must be at most 300',
    );
  });

  it('a row of a list is numbered from 1 with its noun: "Winding 1 voltage"', () => {
    const schema = z.object({
      windings: z
        .array(z.object({ volts: z.number().meta({ title: 'Winding voltage' }) }))
        .meta({ title: 'Winding' }),
    });
    expect(reasons(schema, { windings: [{ volts: 6.3 }, {}] })[0]).toMatchObject({
      field: 'windings.1.volts',
      label: 'Winding 2 voltage',
      reason: 'Winding 2 voltage is required',
    });
  });

  it('a field without a title is named from its key, never by the path', () => {
    const problems = reasons(z.object({ equipmentFamily: z.string() }), {}, 'body');
    expect(problems[0]!.reason).toBe('Equipment family is required');
  });

  it('a schema’s own whole-sentence message is kept; a rule’s predicate follows the label', () => {
    const schema = z.object({
      id: z.uuid('The revision address is not valid').meta({ title: 'Revision address' }),
      title: z
        .string()
        .refine((s) => !s.includes('\n'), 'must be on one line')
        .meta({ title: 'Title' }),
    });
    expect(reasons(schema, { id: 'x', title: 'a\nb' }).map((p) => p.reason)).toEqual([
      'The revision address is not valid',
      'Title must be on one line',
    ]);
  });

  it('an unknown field is named', () => {
    expect(reasons(unitBody.strict(), { model: 'M', serial: 'S', colour: 'red' })[0]!.reason).toBe(
      'This request has no field “colour”',
    );
  });

  it('the forms read their labels from the same schemas', () => {
    expect(labelOf(unitBody, 'jobNumber')).toBe('Job number');
    expect(labelOf(inviteBody, 'displayName')).toBe('Name');
    expect(labelOf(startRunBody, 'mainsVoltage')).toBe('Measured mains');
    expect(labelOf(handoverBody, 'reason')).toBe('Reason for the handover');
    expect(labelOf(abandonBody, 'reason')).toBe('Reason for closing the run');
    expect(labelOf(signInBody, 'password')).toBe('Password');
    expect(labelOf(changePasswordBody, 'currentPassword')).toBe('Current password');
  });

  it('joins problems into one message of sentences', () => {
    expect(problemsMessage([{ reason: 'Model is required' }, { reason: 'Serial is required.' }])).toBe(
      'Model is required. Serial is required.',
    );
    expect(withLabel('Winding 1 voltage', 'is required')).toBe('Winding 1 voltage is required');
    expect(withLabel('Inputs', 'no current flows')).toBe('Inputs: no current flows');
  });
});
