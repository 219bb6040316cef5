import type { Application, Trial } from '../../db/models';
import { MILESTONE_KINDS, MILESTONE_LABELS } from '../domain/trials';

export function serializeTrial(trial: Trial) {
  const pattern = trial.pattern;
  return {
    id: trial.id,
    slug: trial.slug,
    title: trial.title,
    state: trial.state,
    callText: trial.callText,
    requirements: trial.requirements,
    coverage: trial.coverage,
    releasedAt: trial.releasedAt ?? null,
    copiedFromId: trial.copiedFromId ?? null,
    pattern: pattern
      ? {
          id: pattern.id,
          name: pattern.name,
          category: pattern.category,
          sizes: (pattern.sizes ?? []).map((s) => ({ id: s.id, label: s.label })),
          variants: (pattern.variants ?? []).map((v) => ({ id: v.id, name: v.name })),
        }
      : null,
    milestones: MILESTONE_KINDS.flatMap((kind) => {
      const m = trial.milestones?.find((x) => x.kind === kind);
      return m ? [{ kind, label: MILESTONE_LABELS[kind], dueAt: m.dueAt }] : [];
    }),
  };
}

/** An application as the trial's staff see it: the snapshot taken when the tester applied. */
export function serializeApplication(app: Application, sizeLabels: Map<string, string>) {
  const snapshot = app.profileSnapshot as { measurementsMm?: Record<string, number> };
  const advice = app.adviceSnapshot as { size?: { label: string } | null } | null;
  return {
    id: app.id,
    status: app.status,
    applicant: { name: app.user?.name ?? '', email: app.user?.email ?? '' },
    size: app.sizeId ? { id: app.sizeId, label: sizeLabels.get(app.sizeId) ?? '?' } : null,
    variantId: app.variantId,
    measurementsMm: snapshot.measurementsMm ?? {},
    advisedSize: advice?.size?.label ?? null,
    plannedFabric: app.plannedFabric,
    experience: app.experience,
    photoConsent: app.photoConsent,
    note: app.note,
    appliedAt: app.appliedAt,
  };
}
