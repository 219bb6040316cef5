import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import type { UploadFile } from '@/hooks/upload';
import { useMyPhotoActions, useMyPhotos, type MyPhoto, type PhotoConsent, type PhotoStage, type PhotoView } from '@/hooks/use-photos';
import { CONSENT_OPTIONS, PHOTO_MAX_BYTES, VIEWS, VIEW_LABELS } from './labels';
import { PhotoFileInput } from './photo-file-input';
import { OwnPhotoThumb } from './photo-thumb';

type Props = { enrollmentId: string; stage: PhotoStage; readOnly: boolean };

/** An upload under way or one that failed, kept with its file so "Try again" needs no new choice. */
type Pending = { file: UploadFile; consent: PhotoConsent; progress: number | null; failed?: string };

const PROMPTS: Record<PhotoView, string> = {
  front: 'Stand facing the camera, arms relaxed at your sides.',
  side: 'Turn side-on, standing naturally.',
  back: 'Turn your back to the camera, arms relaxed.',
  detail: 'Close-ups of anything worth a closer look: a drag line, a pocket, a seam, a hem.',
};

/** The reason a photo was not taken, in words a tester can act on. */
function failureText(error: unknown, file: UploadFile): string {
  if (!(error instanceof ApiError)) return `${file.name} was not uploaded.`;
  if (error.status === 413) return `${error.message} Photos can be up to ${PHOTO_MAX_BYTES / 1024 / 1024} MB: a smaller or lower-resolution copy will do.`;
  return error.message;
}

/**
 * A tester's photos of one report: front, side and back (one each) and any number of details, each
 * with who may see it. Uploads show their progress; a failed one says why and can be sent again.
 */
export function PhotosSection({ enrollmentId, stage, readOnly }: Props) {
  const { data, error, mutate } = useMyPhotos(enrollmentId);
  const actions = useMyPhotoActions(enrollmentId);
  const [pending, setPending] = useState<Partial<Record<PhotoView, Pending>>>({});
  const [newConsent, setNewConsent] = useState<Partial<Record<PhotoView, PhotoConsent>>>({});
  const [confirming, setConfirming] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  if (error) return <LoadError error={error} onRetry={() => mutate()} />;
  if (!data) return <Loading label="Loading your photos…" />;
  const photos = data.filter((p) => p.stage === stage);

  async function send(view: PhotoView, file: UploadFile, consent: PhotoConsent) {
    if (file.size > PHOTO_MAX_BYTES) {
      setPending((p) => ({ ...p, [view]: { file, consent, progress: null, failed: `${file.name} is too large: photos can be up to ${PHOTO_MAX_BYTES / 1024 / 1024} MB. Choose a smaller copy.` } }));
      return;
    }
    setPending((p) => ({ ...p, [view]: { file, consent, progress: 0 } }));
    try {
      await actions.upload(
        { file, stage, view, consent },
        { onProgress: (progress) => setPending((p) => (p[view] && !p[view]!.failed ? { ...p, [view]: { ...p[view]!, progress } } : p)) },
      );
      setPending((p) => ({ ...p, [view]: undefined }));
    } catch (e) {
      setPending((p) => ({ ...p, [view]: { file, consent, progress: null, failed: failureText(e, file) } }));
    }
  }

  async function changeConsent(photo: MyPhoto, consent: PhotoConsent) {
    if (consent === photo.consent) return;
    setBusy(photo.id);
    setMessage(null);
    try {
      await actions.setConsent(photo.id, consent);
    } catch (e) {
      setMessage(`Not changed: ${e instanceof Error ? e.message : 'please try again.'}`);
    } finally {
      setBusy(null);
    }
  }

  async function remove(photo: MyPhoto) {
    setBusy(photo.id);
    setMessage(null);
    try {
      await actions.remove(photo.id);
      setConfirming(null);
    } catch (e) {
      setMessage(`Not deleted: ${e instanceof Error ? e.message : 'please try again.'}`);
    } finally {
      setBusy(null);
    }
  }

  return (
    <View style={styles.section}>
      <AppText variant="caption">
        Photograph the garment on you from the front, the side and the back, standing naturally in good light. No face is needed: crop the
        photo at the neck if you like. JPEG, PNG or WebP; location and camera details are removed before the photo is stored.
      </AppText>
      {readOnly ? <AppText variant="caption">The report is closed, so photos can no longer be added or deleted; you can still change who may see each one.</AppText> : null}
      {message ? <Notice tone="error">{message}</Notice> : null}
      {VIEWS.map((view) => {
        const mine = photos.filter((p) => p.view === view);
        const upload = pending[view];
        const sending = Boolean(upload && !upload.failed);
        // Front, side and back take one photo each (delete to replace it); details take any number.
        const canAdd = !readOnly && !sending && (view === 'detail' || mine.length === 0);
        const title = VIEW_LABELS[view];
        const noun = view === 'detail' ? 'detail' : title.toLowerCase();
        return (
          <View key={view} style={styles.group} role="group" aria-label={view === 'detail' ? 'Detail photos' : `${title} photos`}>
            <AppText variant="label">{title}</AppText>
            <AppText variant="caption">{PROMPTS[view]}</AppText>
            {mine.map((photo, i) => {
              const name = view === 'detail' ? `Detail photo ${i + 1}` : `${title} photo`;
              return (
                <View key={photo.id} style={styles.photo}>
                  <OwnPhotoThumb photoId={photo.id} label={name} />
                  <View style={styles.photoSide}>
                    <ChoiceGroup
                      label={`Who may see the ${name.toLowerCase()}`}
                      options={CONSENT_OPTIONS}
                      value={photo.consent}
                      onChange={(consent) => busy !== photo.id && void changeConsent(photo, consent)}
                    />
                    {readOnly ? null : confirming === photo.id ? (
                      <View style={styles.confirm} role="alert">
                        <AppText>{`Delete the ${name.toLowerCase()}? It cannot be brought back.`}</AppText>
                        <View style={styles.row}>
                          <Button label="Delete it" tone="danger" busy={busy === photo.id} busyLabel="Deleting…" onPress={() => void remove(photo)} />
                          <Button label="Keep it" tone="quiet" onPress={() => setConfirming(null)} />
                        </View>
                      </View>
                    ) : (
                      <Button label="Delete" tone="quiet" accessibleLabel={`Delete the ${name.toLowerCase()}`} onPress={() => setConfirming(photo.id)} />
                    )}
                  </View>
                </View>
              );
            })}
            {upload && sending ? (
              <View style={styles.progress}>
                <AppText variant="caption">
                  {upload.progress == null
                    ? `Uploading ${upload.file.name}…`
                    : upload.progress >= 1
                      ? `${upload.file.name} is sent; the photo is being prepared…`
                      : `Uploading ${upload.file.name}… ${Math.round(upload.progress * 100)}%`}
                </AppText>
                <View
                  style={styles.track}
                  role="progressbar"
                  aria-label={`Uploading the ${noun} photo`}
                  aria-valuemin={0}
                  aria-valuemax={100}
                  aria-valuenow={upload.progress == null ? undefined : Math.round(upload.progress * 100)}
                >
                  <View style={[styles.bar, { width: `${Math.round((upload.progress ?? 0.1) * 100)}%` }]} />
                </View>
              </View>
            ) : null}
            {upload?.failed ? (
              <View style={styles.failed}>
                <Notice tone="error">{`The ${noun} photo was not uploaded. ${upload.failed}`}</Notice>
                <View style={styles.row}>
                  {upload.file.size <= PHOTO_MAX_BYTES ? (
                    <Button label="Try again" accessibleLabel={`Try again: the ${noun} photo`} onPress={() => void send(view, upload.file, upload.consent)} />
                  ) : null}
                  <Button label="Dismiss" tone="quiet" onPress={() => setPending((p) => ({ ...p, [view]: undefined }))} />
                </View>
              </View>
            ) : null}
            {canAdd ? (
              <View style={styles.add}>
                <ChoiceGroup
                  label={`Who may see a new ${noun} photo`}
                  options={CONSENT_OPTIONS}
                  value={newConsent[view] ?? 'staff-only'}
                  onChange={(consent) => setNewConsent((c) => ({ ...c, [view]: consent }))}
                />
                <PhotoFileInput
                  label={`Add a ${noun} photo`}
                  onFile={(file) => void send(view, file, newConsent[view] ?? 'staff-only')}
                />
              </View>
            ) : null}
            {readOnly && mine.length === 0 ? <AppText variant="caption">No photo.</AppText> : null}
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  section: { gap: space.md },
  group: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
  photo: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-start' },
  photoSide: { flex: 1, minWidth: 200, gap: space.sm },
  confirm: { gap: space.sm, padding: space.md, borderRadius: radius.sm, backgroundColor: colors.warningSoft },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  progress: { gap: space.xs },
  track: { height: 8, borderRadius: 4, backgroundColor: colors.surfaceSunken, overflow: 'hidden' },
  bar: { height: 8, backgroundColor: colors.thread },
  failed: { gap: space.sm },
  add: { gap: space.sm, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderStyle: 'dashed', borderColor: colors.line },
});
