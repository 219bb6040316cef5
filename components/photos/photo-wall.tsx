import { useState } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import { useTrialPhotos, type PhotoStage, type PhotoView, type WallPhoto } from '@/hooks/use-photos';
import { CONSENT_SHORT, STAGE_LABELS, VIEWS, VIEW_LABELS } from './labels';
import { THUMB, Thumbnail } from './photo-thumb';
import { PhotoViewer } from './photo-viewer';

type SizeRow = { id: string; label: string; photos: WallPhoto[] };

/** Rows by size in the order the server gives (grading order), keeping each row's photos in order. */
function bySize(photos: WallPhoto[]): SizeRow[] {
  const rows: SizeRow[] = [];
  for (const photo of photos) {
    let row = rows.find((r) => r.id === photo.size.id);
    if (!row) rows.push((row = { id: photo.size.id, label: photo.size.label, photos: [] }));
    row.photos.push(photo);
  }
  return rows;
}

function WallThumb({ photo, onOpen, onBroken, showView }: { photo: WallPhoto; onOpen: () => void; onBroken: () => void; showView: boolean }) {
  const label = `${photo.view === 'detail' ? 'Detail' : VIEW_LABELS[photo.view]} photo of ${photo.tester.name}, size ${photo.size.label}`;
  const who = showView ? `${VIEW_LABELS[photo.view]} · ${photo.tester.name}` : photo.tester.name;
  const which = `${photo.stage === 'check-in' ? 'toile' : 'final'} · ${CONSENT_SHORT[photo.consent]}`;
  // The name ends with the captions as shown, so what is heard matches what is seen. The captions
  // wrap under the thumbnail rather than being cut short.
  return (
    <Pressable role="button" aria-label={`Open the ${label[0].toLowerCase()}${label.slice(1)}. ${who} ${which}`} onPress={onOpen} style={styles.thumb}>
      <Thumbnail uri={photo.thumbUrl} label={label} onError={onBroken} />
      <AppText variant="caption" style={styles.caption}>
        {`${who} `}
      </AppText>
      <AppText variant="caption" style={styles.caption}>
        {which}
      </AppText>
    </Pressable>
  );
}

/**
 * The trial's photos for its staff, side by side by size and view: on a wide screen a grid of
 * sizes (rows, grading order) × views (columns); on a phone one size per row that scrolls sideways.
 * A photo opens at full size with whose it is and who may see it.
 */
export function PhotoWall({ studioId, trialId }: { studioId: string; trialId: string }) {
  const wide = useIsWide();
  const [stage, setStage] = useState<PhotoStage | ''>('');
  const [view, setView] = useState<PhotoView | ''>('');
  const [open, setOpen] = useState<WallPhoto | null>(null);
  const { data, error, mutate } = useTrialPhotos(studioId, trialId, { stage: stage || undefined, view: view || undefined });
  // A thumbnail that fails may have outlived its link: fetch the wall (and fresh links) once more.
  const [refreshed, setRefreshed] = useState(false);
  const onBroken = () => {
    if (refreshed) return;
    setRefreshed(true);
    void mutate();
  };
  const rows = data ? bySize(data) : [];
  const columns = view ? [view] : VIEWS;

  return (
    <Card title="Photos">
      <ChoiceGroup
        label="Photos from"
        options={[{ value: '', label: 'Both reports' }, ...(['check-in', 'final'] as const).map((s) => ({ value: s, label: STAGE_LABELS[s] }))]}
        value={stage}
        onChange={setStage}
      />
      <ChoiceGroup label="View" options={[{ value: '', label: 'All views' }, ...VIEWS.map((v) => ({ value: v, label: VIEW_LABELS[v] }))]} value={view} onChange={setView} />
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading label="Loading photos…" /> : null}
      {data && data.length === 0 ? <Empty>No photos match yet. Testers add them to their check-in and final reports.</Empty> : null}
      {rows.length > 0 && wide ? (
        <View role="table" aria-label="Photos by size and view" style={styles.table}>
          <View role="row" style={styles.row}>
            <AppText role="columnheader" variant="label" style={styles.sizeCell}>
              Size
            </AppText>
            {columns.map((v) => (
              <AppText key={v} role="columnheader" variant="label" style={styles.cell}>
                {VIEW_LABELS[v]}
              </AppText>
            ))}
          </View>
          {rows.map((row) => (
            <View key={row.id} role="row" aria-label={`Size ${row.label}`} style={[styles.row, styles.bodyRow]}>
              <AppText role="rowheader" style={[styles.sizeCell, styles.sizeLabel]}>
                {row.label}
              </AppText>
              {columns.map((v) => {
                const cell = row.photos.filter((p) => p.view === v);
                return (
                  <View key={v} role="cell" aria-label={`Size ${row.label}, ${VIEW_LABELS[v].toLowerCase()}`} style={[styles.cell, styles.thumbs]}>
                    {cell.length === 0 ? <AppText variant="caption">—</AppText> : null}
                    {cell.map((p) => (
                      <WallThumb key={p.id} photo={p} showView={false} onOpen={() => setOpen(p)} onBroken={onBroken} />
                    ))}
                  </View>
                );
              })}
            </View>
          ))}
        </View>
      ) : null}
      {rows.length > 0 && !wide
        ? rows.map((row) => (
            <View key={row.id} style={styles.phoneRow} role="group" aria-label={`Size ${row.label}`}>
              <AppText variant="label">{`Size ${row.label} · ${row.photos.length} ${row.photos.length === 1 ? 'photo' : 'photos'}`}</AppText>
              <ScrollView horizontal contentContainerStyle={styles.strip} showsHorizontalScrollIndicator>
                {row.photos.map((p) => (
                  <WallThumb key={p.id} photo={p} showView onOpen={() => setOpen(p)} onBroken={onBroken} />
                ))}
              </ScrollView>
            </View>
          ))
        : null}
      {open ? <PhotoViewer photo={open} onClose={() => setOpen(null)} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  table: { borderWidth: 1, borderColor: colors.line, borderRadius: radius.sm },
  row: { flexDirection: 'row', alignItems: 'flex-start', padding: space.sm, gap: space.sm },
  bodyRow: { borderTopWidth: 1, borderTopColor: colors.line },
  sizeCell: { width: 64 },
  sizeLabel: { fontFamily: fonts.semibold },
  cell: { flex: 1, minWidth: THUMB.width },
  thumbs: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  thumb: { width: THUMB.width, gap: 2 },
  caption: { width: THUMB.width },
  phoneRow: { gap: space.xs },
  strip: { gap: space.sm, paddingBottom: space.xs },
});
