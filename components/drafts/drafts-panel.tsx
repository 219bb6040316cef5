import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, fonts, radius, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { downloadDraftFile, uploadDraft, usePatternDrafts, type DraftRow } from '@/hooks/use-drafts';
import { DRAFT_FILE_KINDS, DRAFT_FILE_LABELS, type DraftFileKind } from '@/server/domain/drafts';
import { PdfFileInput } from './pdf-file-input';

export function DraftFiles({ draft, onError }: { draft: DraftRow; onError: (message: string) => void }) {
  return (
    <>
      {draft.files.map((f) => (
        <View key={f.id} style={styles.file}>
          <AppText variant="caption">{`${DRAFT_FILE_LABELS[f.kind as DraftFileKind] ?? f.kind}: ${f.name} (${Math.max(1, Math.round(f.bytes / 1024))} KB)`}</AppText>
          <Button label="Download" accessibleLabel={`Download ${f.name}, draft ${draft.version}`} tone="quiet" onPress={() => downloadDraftFile(f.id).catch((e: Error) => onError(e.message))} />
          {f.downloadedBy ? (
            <AppText variant="caption">{f.downloadedBy.length ? `Downloaded by ${f.downloadedBy.map((d) => d.name).join(', ')}` : 'Not downloaded yet'}</AppText>
          ) : null}
        </View>
      ))}
    </>
  );
}

/** The pattern's draft versions with their change notes, who has which, and a new upload. */
export function DraftsPanel({ studioId, patternId, canUpload }: { studioId: string; patternId: string; canUpload: boolean }) {
  const { data, error, mutate } = usePatternDrafts(studioId, patternId);
  const [note, setNote] = useState('');
  const [files, setFiles] = useState<Partial<Record<DraftFileKind, File>>>({});
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const send = async () => {
    setBusy(true);
    setMessage(null);
    const form = new FormData();
    form.append('changeNote', note);
    for (const [kind, file] of Object.entries(files)) if (file) form.append(kind, file, file.name);
    try {
      const draft = await uploadDraft(studioId, patternId, form);
      setMessage({ tone: 'success', text: `Draft ${draft.version} uploaded; its testers were told by e-mail.` });
      setNote('');
      setFiles({});
    } catch (e) {
      const detail = e instanceof ApiError && e.fields ? ` ${Object.entries(e.fields).map(([k, v]) => `${k}: ${v}`).join('; ')}` : '';
      setMessage({ tone: 'error', text: `${e instanceof Error ? e.message : 'Not uploaded.'}${detail}` });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Drafts">
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {canUpload ? (
        <View style={styles.upload}>
          <AppText variant="label">New draft</AppText>
          <TextField label="What changed" hint="Testers see this note, e.g. “Back rise lengthened by 3/8 in”." value={note} onChangeText={setNote} multiline />
          {DRAFT_FILE_KINDS.map((kind) => (
            <View key={kind} style={styles.pick}>
              <AppText variant="caption">{DRAFT_FILE_LABELS[kind]}</AppText>
              <PdfFileInput label={`${DRAFT_FILE_LABELS[kind]} (PDF)`} onFile={(file) => setFiles((f) => ({ ...f, [kind]: file ?? undefined }))} />
            </View>
          ))}
          <Button label="Upload draft" busyLabel="Uploading…" busy={busy} onPress={send} />
        </View>
      ) : null}
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data && data.length === 0 ? <Empty>No drafts yet.</Empty> : null}
      {data?.map((d) => (
        <View key={d.id} style={styles.draft}>
          <AppText style={styles.strong}>{`Draft ${d.version} · ${dayjs(d.createdAt).format('D MMM YYYY')}`}</AppText>
          <AppText variant="caption">{d.changeNote}</AppText>
          <DraftFiles draft={d} onError={(text) => setMessage({ tone: 'error', text })} />
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  upload: { gap: space.sm, paddingBottom: space.md },
  pick: { gap: 2 },
  draft: { gap: space.xs, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line },
  file: { gap: 2, paddingLeft: space.sm },
  strong: { fontFamily: fonts.semibold },
});
