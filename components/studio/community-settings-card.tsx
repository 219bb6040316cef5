import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import useSWR, { mutate } from 'swr';
import { applyApiError } from '@/components/forms/api-errors';
import { EMAIL_INPUT, FormTextField } from '@/components/forms/form-text-field';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { api } from '@/hooks/api';
import { contactSettingsFormSchema, type ContactSettingsForm } from '@/server/domain/schemas/release';

type StudioSettings = { id: string; settings: { contactEmail: string | null; photoRetentionDays: number | null } };

function Form({ studio, canEdit }: { studio: StudioSettings; canEdit: boolean }) {
  const key = `/api/studios/${studio.id}`;
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const { control, handleSubmit, setError, formState } = useForm<ContactSettingsForm>({
    resolver: zodResolver(contactSettingsFormSchema),
    defaultValues: {
      contactEmail: studio.settings.contactEmail ?? '',
      keepPhotos: studio.settings.photoRetentionDays === null ? 'always' : 'days',
      photoRetentionDays: studio.settings.photoRetentionDays === null ? '365' : String(studio.settings.photoRetentionDays),
    },
  });
  const keepPhotos = useWatch({ control, name: 'keepPhotos' });
  const submit = handleSubmit(async (v) => {
    setFormError(null);
    setSaved(false);
    try {
      const settings = { contactEmail: v.contactEmail || null, photoRetentionDays: v.keepPhotos === 'always' ? null : Number(v.photoRetentionDays) };
      await mutate(key, await api<StudioSettings>(key, { method: 'PATCH', body: { settings } }), { revalidate: false });
      setSaved(true);
    } catch (error) {
      const message = applyApiError(error, (name, e) => setError(name === 'contactEmail' ? 'contactEmail' : 'photoRetentionDays', e), ['contactEmail', 'photoRetentionDays']);
      setFormError(message);
    }
  });
  return (
    <>
      <FormTextField
        control={control}
        name="contactEmail"
        label="Contact address for testers’ replies"
        hint="Messages to testers come from Basted; their replies go to this address."
        editable={canEdit}
        {...EMAIL_INPUT}
      />
      <Controller
        control={control}
        name="keepPhotos"
        render={({ field }) => (
          <ChoiceGroup
            label="Testers’ photos after a release"
            options={[
              { value: 'days', label: 'Remove after a number of days' },
              { value: 'always', label: 'Keep until removed by hand' },
            ]}
            value={field.value}
            onChange={(v) => canEdit && field.onChange(v)}
          />
        )}
      />
      {keepPhotos === 'days' ? (
        <FormTextField control={control} name="photoRetentionDays" label="Days to keep photos after the release" inputMode="numeric" editable={canEdit} />
      ) : null}
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {saved ? <Notice tone="success">Saved.</Notice> : null}
      {canEdit ? <Button label="Save" busy={formState.isSubmitting} busyLabel="Saving…" onPress={submit} /> : <AppText variant="caption">Set by the studio owner.</AppText>}
    </>
  );
}

/** The studio's address for testers' replies and how long testers' photos are kept after a release. */
export function CommunitySettingsCard({ studioId, canEdit }: { studioId: string; canEdit: boolean }) {
  const { data } = useSWR<StudioSettings>(`/api/studios/${studioId}`);
  return <Card title="Testers’ replies and photos">{data?.settings ? <Form key={data.id} studio={data} canEdit={canEdit} /> : null}</Card>;
}
