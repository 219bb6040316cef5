import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';
import { applyApiError } from '@/components/forms/api-errors';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { SwitchField } from '@/components/ui/switch-field';
import { TextField } from '@/components/ui/text-field';
import { space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import { saveProfile, useProfile, type Profile } from '@/hooks/use-profile';
import { useSession } from '@/hooks/use-session';
import { measurementPlaceholder } from '@/server/domain/category-wording';
import { MEASUREMENTS } from '@/server/domain/measurements';
import { STAFF_ROLES } from '@/server/domain/roles';
import { EXPERIENCE_LABELS, EXPERIENCE_LEVELS, profileSchema } from '@/server/domain/schemas/profile';
import { deviceTimeZone } from '@/server/domain/time-zones';

type Values = z.input<typeof profileSchema>;

const MAIL_CHOICES = [
  { key: 'reminders', label: 'Deadline reminders for my trials', staffOnly: false },
  { key: 'trialNews', label: 'Trial news: selection, new drafts', staffOnly: false },
  // Sent only to a studio's owners and coordinators: nobody else is offered it.
  { key: 'digest', label: 'Daily list of overdue testers in my studios', staffOnly: true },
] as const;

function ProfileForm({ profile, runsTrials }: { profile: Profile; runsTrials: boolean }) {
  const wide = useIsWide();
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  // Fields whose typed text could not be read: saving waits until they are fixed.
  const [unreadable, setUnreadable] = useState<string[]>([]);
  const { control, handleSubmit, setError, setValue, formState } = useForm<Values>({
    resolver: zodResolver(profileSchema),
    defaultValues: {
      name: profile.name,
      lengthUnit: profile.lengthUnit,
      fabricUnit: profile.fabricUnit,
      timeZone: profile.timeZone,
      experience: (profile.experience as Values['experience']) ?? null,
      fitNotes: profile.fitNotes ?? '',
      measurementsMm: profile.measurementsMm,
      mail: profile.mail,
    },
  });
  const unit = useWatch({ control, name: 'lengthUnit' }) ?? 'in';
  const zone = useWatch({ control, name: 'timeZone' });
  const [device] = useState(deviceTimeZone);

  const submit = handleSubmit(async (values) => {
    setSaved(false);
    setFormError(null);
    if (unreadable.length) {
      setFormError(`Not saved: ${unreadable.join(', ')} could not be read. Correct ${unreadable.length === 1 ? 'it' : 'them'} first.`);
      return;
    }
    try {
      await saveProfile(values);
      setSaved(true);
    } catch (error) {
      setFormError(
        applyApiError(error, setError, ['name', 'lengthUnit', 'fabricUnit', 'timeZone', 'experience', 'fitNotes', 'measurementsMm', 'mail'], {
          name: 'Name',
          timeZone: 'Time zone',
          experience: 'Sewing experience',
          fitNotes: 'Fit notes',
          measurementsMm: 'Body measurements',
          mail: 'E-mail',
          ...Object.fromEntries(MEASUREMENTS.map((m) => [`measurementsMm.${m.key}`, m.label])),
        }),
      );
    }
  });

  return (
    <>
      <Card title="You">
        <Controller
          control={control}
          name="name"
          render={({ field, fieldState }) => <TextField label="Name" value={field.value ?? ''} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} />}
        />
        <Controller
          control={control}
          name="lengthUnit"
          render={({ field }) => (
            <ChoiceGroup label="Show lengths in" options={[{ value: 'in', label: 'Inches' }, { value: 'cm', label: 'Centimetres' }]} value={field.value} onChange={field.onChange} />
          )}
        />
        <Controller
          control={control}
          name="fabricUnit"
          render={({ field }) => (
            <ChoiceGroup label="Fabric lengths in" options={[{ value: 'yd', label: 'Yards' }, { value: 'm', label: 'Metres' }]} value={field.value} onChange={field.onChange} />
          )}
        />
        <Controller
          control={control}
          name="timeZone"
          render={({ field, fieldState }) => (
            <TextField
              label="Time zone"
              hint="Reminders arrive in your morning, e.g. Europe/Lisbon."
              value={field.value ?? ''}
              onChangeText={field.onChange}
              onBlur={field.onBlur}
              error={fieldState.error?.message}
              autoCapitalize="none"
            />
          )}
        />
        {zone !== device ? <Button label={`Use this device’s zone: ${device}`} tone="quiet" onPress={() => setValue('timeZone', device, { shouldDirty: true })} /> : null}
        <Controller
          control={control}
          name="experience"
          render={({ field, fieldState }) => (
            <ChoiceGroup
              label="Sewing experience"
              options={EXPERIENCE_LEVELS.map((e) => ({ value: e, label: EXPERIENCE_LABELS[e] }))}
              value={field.value}
              onChange={field.onChange}
              error={fieldState.error?.message}
            />
          )}
        />
      </Card>

      <Card title="Body measurements">
        <AppText variant="caption">
          Measure over underwear, tape snug but not tight. Type them as you like: 38 1/2, 38-1/2, 97.8 cm or 978 mm. Only the studios of trials you apply to see them.
        </AppText>
        <View style={[styles.grid, wide && styles.gridWide]}>
          {MEASUREMENTS.map((m) => (
            <View key={m.key} style={wide ? styles.cellWide : undefined}>
              <Controller
                control={control}
                name={`measurementsMm.${m.key}`}
                render={({ field, fieldState }) => (
                  <MeasurementField
                    label={m.label}
                    hint={m.hint}
                    unit={unit}
                    placeholder={measurementPlaceholder(m.key, unit)}
                    valueMm={field.value ?? null}
                    onChangeMm={field.onChange}
                    onBlur={field.onBlur}
                    error={fieldState.error?.message}
                    onInputError={(message) =>
                      setUnreadable((now) => (message ? [...new Set([...now, m.label])] : now.filter((l) => l !== m.label)))
                    }
                  />
                )}
              />
            </View>
          ))}
        </View>
        <Controller
          control={control}
          name="fitNotes"
          render={({ field, fieldState }) => (
            <TextField
              label="Fit notes"
              hint="Alterations you usually make, e.g. full seat, sway back, petite."
              value={field.value ?? ''}
              onChangeText={field.onChange}
              onBlur={field.onBlur}
              error={fieldState.error?.message}
              multiline
            />
          )}
        />
      </Card>

      <Card title="E-mail">
        <AppText variant="caption">Account and security messages (sign-in, password, invitations) are always sent.</AppText>
        {MAIL_CHOICES.filter((choice) => runsTrials || !choice.staffOnly).map((choice) => (
          <Controller
            key={choice.key}
            control={control}
            name={`mail.${choice.key}`}
            render={({ field }) => (
              <SwitchField label={choice.label} value={field.value ?? true} onValueChange={field.onChange} />
            )}
          />
        ))}
      </Card>

      {formError ? <Notice tone="error">{formError}</Notice> : null}
      {saved ? <Notice tone="success">Profile saved.</Notice> : null}
      <Button label="Save profile" busyLabel="Saving…" busy={formState.isSubmitting} onPress={submit} />
    </>
  );
}

export default function ProfileScreen() {
  const { data, error, mutate } = useProfile();
  const { session } = useSession();
  const studios = session?.studios ?? [];
  const runsTrials = studios.some((s) => s.role === 'owner' || s.role === 'coordinator');
  const staff = studios.some((s) => STAFF_ROLES.includes(s.role));
  return (
    <Screen title="Profile" intro="Your measurements and preferences. Each application you make keeps a copy as it was then.">
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading /> : null}
      {data ? <ProfileForm profile={data} runsTrials={runsTrials} /> : null}
      {data && session && !staff ? (
        <Card title="Design patterns?">
          <AppText variant="caption">Start a studio for your pattern brand to run fit trials of your own.</AppText>
          <ButtonLink href="/studios" label="Start a studio" tone="quiet" />
        </Card>
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  grid: { gap: space.md },
  gridWide: { flexDirection: 'row', flexWrap: 'wrap' },
  cellWide: { width: '48%' },
});
