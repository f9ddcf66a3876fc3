import { describe, expect, it } from 'vitest';
import { AUDIT_ACTIONS, auditActionLabel, auditSentence } from '../../shared/audit-actions';

describe('audit entries in words', () => {
  it('reads an approval as a sentence naming the revision and the procedure', () => {
    expect(
      auditSentence('revision.approved', { actor: 'Marek Vos', subject: 'TC-18 mains fuse r3', details: {} }),
    ).toBe('Marek Vos approved revision 3 of TC-18 mains fuse.');
  });

  it('starts an entry with no person (a refused sign-in) with what happened', () => {
    expect(
      auditSentence('sign-in.failed', { actor: null, subject: 'tom@tallowcreek.example', details: {} }),
    ).toBe('A sign-in as tom@tallowcreek.example was refused.');
  });

  it('counts what the details count', () => {
    expect(
      auditSentence('run.signed', { actor: 'Tom', subject: 'run x', details: { outOfTolerance: 2 } }),
    ).toBe('Tom signed a bench run with 2 readings out of band.');
  });

  it('gives every recorded action a label and a sentence without its raw key', () => {
    for (const action of AUDIT_ACTIONS) {
      expect(auditActionLabel(action), action).not.toBe(action);
      const sentence = auditSentence(action, { actor: 'Ines Okafor', subject: 'x r1', details: {} });
      expect(sentence, action).not.toContain(action);
      expect(sentence, action).toMatch(/^Ines Okafor [a-z].*\.$/);
    }
  });
});
