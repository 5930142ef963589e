/**
 * The one verdict of an analysis, also for analyses stored before the engine returned a status
 * (those carry only the pass flags): a stored analysis without checked fixtures is incomplete,
 * never a pass.
 */
import type { Analysis, VerdictStatus } from './types';

type VerdictLike = Pick<Analysis, 'fixtures'> & {
  verdict: Partial<Pick<Analysis['verdict'], 'status'>> & Pick<Analysis['verdict'], 'allFixturesPass' | 'allVelocitiesPass' | 'allStaticPass'>;
};

export function verdictStatus(a: VerdictLike): VerdictStatus {
  if (a.verdict.status) return a.verdict.status;
  if (a.fixtures.length === 0) return 'incomplete';
  return a.verdict.allFixturesPass && a.verdict.allVelocitiesPass && a.verdict.allStaticPass ? 'pass' : 'fail';
}
