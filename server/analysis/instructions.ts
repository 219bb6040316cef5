// Instruction steps reported unclear (DESIGN.md §8). One tester's confusion is noted; two or more
// testers stuck on the same step is a flag for the instructions.
import { naturalCompare } from './collate';
import { resolveThresholds, type Thresholds } from './thresholds';
import type { AnalysisInput, UnclearStep } from './types';

export function unclearSteps(input: AnalysisInput, draft: string, thresholds?: Partial<Thresholds>): UnclearStep[] {
  const t = resolveThresholds(thresholds);
  const byStep = new Map<string, Set<string>>();
  for (const r of input.reports) {
    if (r.draft !== draft) continue;
    for (const step of r.unclearSteps ?? []) {
      const testers = byStep.get(step) ?? new Set<string>();
      testers.add(r.tester);
      byStep.set(step, testers);
    }
  }
  return [...byStep.entries()]
    .map(([step, testers]) => ({
      step,
      count: testers.size,
      testers: [...testers].sort(naturalCompare),
      flagged: testers.size >= t.unclearStepMinTesters,
    }))
    .sort((a, b) => b.count - a.count || naturalCompare(a.step, b.step));
}
