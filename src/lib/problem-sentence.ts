import { humanize, withLabel } from '@shared/schemas/problems';
import type { FieldProblem } from './api-client';

/**
 * A field problem as one sentence: the server names the field in its reason where it knows the label.
 * Apart from lib/form.ts, which re-exports it: the error page in the entry script words problems
 * too, and importing the form module there would put react-hook-form into the entry.
 */
export function problemSentence(problem: FieldProblem): FieldProblem {
  if (problem.label || /^[A-Z]/.test(problem.reason)) return problem;
  const label = humanize(
    problem.field
      .replace(/^(body|query|params)\./, '')
      .split('.')
      .pop() ?? '',
  );
  return { ...problem, label, reason: withLabel(label, problem.reason) };
}
