import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { ChartEditor } from '@/components/patterns/chart-editor';
import { CautionsPanel } from '@/components/patterns/cautions-panel';
import { DraftsPanel } from '@/components/drafts/drafts-panel';
import { CsvPanel } from '@/components/patterns/csv-panel';
import { FabricNeedsEditor } from '@/components/patterns/fabric-needs-editor';
import { PatternDetailsForm } from '@/components/patterns/pattern-details-form';
import { TryAdvicePanel } from '@/components/patterns/try-advice-panel';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { ApiError } from '@/hooks/api';
import { updatePattern, usePattern } from '@/hooks/use-patterns';
import { useSession } from '@/hooks/use-session';
import { FABRIC_KINDS, GARMENT_CATEGORIES, type GarmentCategory } from '@/server/domain/garments';
import { can } from '@/server/domain/policy';

export default function PatternScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const { session, currentStudio } = useSession();
  const studioId = currentStudio?.id;
  const { data: pattern, error, mutate } = usePattern(studioId, id);
  // Bumped after a CSV import, so the editors start again from the saved chart.
  const [generation, setGeneration] = useState(0);

  if (error) {
    return (
      <Screen title="Pattern">
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">There is no such pattern in this studio.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!pattern || !studioId || !session) return <Loading />;

  const canEdit = can(currentStudio?.role, 'patterns.write');
  const category = GARMENT_CATEGORIES.find((c) => c.key === pattern.category);
  const fabric = FABRIC_KINDS.find((k) => k.key === pattern.fabricKind);
  const intro = `${category?.label ?? pattern.category}${pattern.childrensWear && pattern.category !== 'childrens-wear' ? ' · for children' : ''} · ${fabric?.label ?? pattern.fabricKind}${
    pattern.minStretchPct != null ? ` (at least ${pattern.minStretchPct} % stretch)` : ''
  }${pattern.archived ? ' · archived' : ''}${canEdit ? '' : ' · read-only'}`;

  return (
    <Screen title={pattern.name} intro={intro}>
      <CautionsPanel pattern={{ category: pattern.category, childrensWear: pattern.childrensWear, draftedHeightMm: pattern.chart.draftedHeightMm, sizes: pattern.chart.sizes }} unit={session.user.lengthUnit} />
      {canEdit ? <PatternDetailsForm key={`details-${pattern.id}`} studioId={studioId} pattern={pattern} /> : null}
      <ChartEditor key={`chart-${generation}`} studioId={studioId} pattern={pattern} unit={session.user.lengthUnit} canEdit={canEdit} />
      <CsvPanel studioId={studioId} patternId={pattern.id} canEdit={canEdit} onImported={() => setGeneration((g) => g + 1)} />
      <FabricNeedsEditor key={`fabric-${generation}-${pattern.chart.sizes.length}`} studioId={studioId} pattern={pattern} lengthUnit={session.user.lengthUnit} fabricUnit={session.user.fabricUnit} canEdit={canEdit} />
      <DraftsPanel studioId={studioId} patternId={pattern.id} canUpload={canEdit} />
      <TryAdvicePanel studioId={studioId} patternId={pattern.id} category={pattern.category as GarmentCategory} columns={pattern.chart.bodyColumns} unit={session.user.lengthUnit} />
      {canEdit ? (
        <Button
          label={pattern.archived ? 'Restore from the archive' : 'Archive this pattern'}
          tone="quiet"
          onPress={() => updatePattern(studioId, pattern.id, { archived: !pattern.archived })}
        />
      ) : null}
    </Screen>
  );
}
