/** The procedure check's entry point; the rules live in ./check. */
export { lintProcedure, DEFAULT_CHECK_OPTIONS, RULES } from './check';
export type { CheckLevel, CheckOptions, LintCode, LintWarning } from './check';
