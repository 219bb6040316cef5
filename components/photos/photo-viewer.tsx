import { useState } from 'react';
import { ActivityIndicator, Image, Modal, ScrollView, StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { usePhotoLink, type WallPhoto } from '@/hooks/use-photos';
import { CONSENT_LABELS, STAGE_LABELS, VIEW_LABELS } from './labels';

/** One photo of the wall at full size (a fresh short-lived link), with whose it is and who may see it. */
export function PhotoViewer({ photo, onClose }: { photo: WallPhoto; onClose: () => void }) {
  const { data, error, mutate } = usePhotoLink(photo.id, 'full');
  // A link that lapsed is asked for once more; a second failure is said, not looped on.
  const [failures, setFailures] = useState(0);
  const title = `${VIEW_LABELS[photo.view]} · ${photo.tester.name} · size ${photo.size.label}${photo.variant ? ` (${photo.variant})` : ''}`;
  return (
    // On the web the modal is the dialog (named here): it keeps the focus inside while open, closes on
    // Escape, and hands the focus back to the photo that opened it.
    <Modal visible transparent animationType="fade" onRequestClose={onClose} aria-label={title}>
      <View style={styles.backdrop}>
        <View style={styles.sheet}>
          <ScrollView contentContainerStyle={styles.content}>
            <AppText variant="heading">{title}</AppText>
            <AppText variant="caption">
              {`${STAGE_LABELS[photo.stage]} · draft ${photo.draftVersion ?? 'not given'} · ${CONSENT_LABELS[photo.consent]}`}
            </AppText>
            {failures > 1 ? <Notice tone="error">The photo cannot be shown just now. Please try again later.</Notice> : null}
            {error ? <Notice tone="error">{`The photo cannot be shown: ${error.message}`}</Notice> : null}
            {!data && !error ? (
              <View style={styles.loading} role="progressbar" aria-label="Loading the photo">
                <ActivityIndicator color={colors.thread} aria-hidden />
              </View>
            ) : null}
            {data && failures < 2 ? (
              <Image
                source={{ uri: data.url }}
                accessible
                role="img"
                aria-label={`${title}, full size`}
                resizeMode="contain"
                style={[styles.image, { aspectRatio: photo.width > 0 && photo.height > 0 ? photo.width / photo.height : 3 / 4 }]}
                onError={() => {
                  setFailures((n) => n + 1);
                  if (failures === 0) void mutate();
                }}
              />
            ) : null}
            <Button label="Close" tone="quiet" onPress={onClose} />
          </ScrollView>
        </View>
      </View>
    </Modal>
  );
}

const styles = StyleSheet.create({
  backdrop: { flex: 1, backgroundColor: 'rgba(31, 29, 26, 0.6)', alignItems: 'center', justifyContent: 'center', padding: space.md },
  sheet: { width: '100%', maxWidth: 720, maxHeight: '100%', backgroundColor: colors.surface, borderRadius: radius.md },
  content: { padding: space.lg, gap: space.sm },
  loading: { padding: space.xl, alignItems: 'center' },
  image: { width: '100%', maxHeight: 640, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
});
