import { useState } from 'react';
import { ActivityIndicator, Image, StyleSheet, View } from 'react-native';
import { AppText } from '@/components/ui/text';
import { colors, radius } from '@/constants/theme';
import { usePhotoLink } from '@/hooks/use-photos';

export const THUMB = { width: 96, height: 128 } as const;

/** A thumbnail shown from a signed link; a link that has lapsed is asked for again. */
export function Thumbnail({ uri, label, onError }: { uri: string; label: string; onError?: () => void }) {
  return <Image source={{ uri }} accessible aria-label={label} role="img" resizeMode="cover" style={styles.image} onError={onError} />;
}

/** A thumbnail of one of the caller's own photos: asks the server for its short-lived link first. */
export function OwnPhotoThumb({ photoId, label }: { photoId: string; label: string }) {
  const { data, error, mutate } = usePhotoLink(photoId, 'thumb');
  // One fresh link after a failed load (it may have lapsed); a second failure is shown, not looped on.
  const [retried, setRetried] = useState(false);
  const [broken, setBroken] = useState(false);
  if (error || broken) {
    return (
      <View style={[styles.image, styles.placeholder]}>
        <AppText variant="caption">Cannot show it just now</AppText>
      </View>
    );
  }
  if (!data) {
    return (
      <View style={[styles.image, styles.placeholder]} role="progressbar" aria-label={`Loading ${label.toLowerCase()}`}>
        <ActivityIndicator color={colors.thread} aria-hidden />
      </View>
    );
  }
  return (
    <Thumbnail
      uri={data.url}
      label={label}
      onError={() => {
        if (retried) setBroken(true);
        else {
          setRetried(true);
          void mutate();
        }
      }}
    />
  );
}

const styles = StyleSheet.create({
  image: { ...THUMB, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
  placeholder: { alignItems: 'center', justifyContent: 'center', padding: 4 },
});
