import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { applyApiError } from '@/components/forms/api-errors';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { createPattern } from '@/hooks/use-patterns';
import { FOR_CHILDREN, FOR_CHILDREN_HINT } from './pattern-details-form';
import { FABRIC_KINDS, GARMENT_CATEGORIES } from '@/server/domain/garments';
import { createPatternSchema } from '@/server/domain/schemas/patterns';

type Values = z.input<typeof createPatternSchema>;

export function NewPatternForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<Values, unknown, z.output<typeof createPatternSchema>>({
    resolver: zodResolver(createPatternSchema),
    defaultValues: { name: '', category: 'trousers', fabricKind: 'woven', minStretchPct: null, notes: null, childrensWear: false },
  });
  const fabricKind = useWatch({ control, name: 'fabricKind' });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const pattern = await createPattern(studioId, values);
      router.push({ pathname: '/patterns/[id]', params: { id: pattern.id } });
    } catch (error) {
      setFormError(applyApiError(error, setError, ['name', 'category', 'fabricKind', 'childrensWear', 'minStretchPct', 'notes']));
    }
  });
  return (
    <Card title="New pattern">
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <Controller
        control={control}
        name="name"
        render={({ field, fieldState }) => <TextField label="Pattern name" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} />}
      />
      <Controller
        control={control}
        name="category"
        render={({ field, fieldState }) => (
          <ChoiceGroup label="Garment" options={GARMENT_CATEGORIES.map((c) => ({ value: c.key, label: c.label }))} value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
        )}
      />
      <Controller
        control={control}
        name="childrensWear"
        render={({ field, fieldState }) => (
          <>
            <ChoiceGroup label="Made for children" options={FOR_CHILDREN} value={field.value ? 'yes' : 'no'} onChange={(v) => field.onChange(v === 'yes')} error={fieldState.error?.message} />
            <AppText variant="caption">{FOR_CHILDREN_HINT}</AppText>
          </>
        )}
      />
      <Controller
        control={control}
        name="fabricKind"
        render={({ field, fieldState }) => (
          <ChoiceGroup label="Fabric" options={FABRIC_KINDS.map((k) => ({ value: k.key, label: k.label }))} value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
        )}
      />
      {fabricKind === 'knit' ? (
        <Controller
          control={control}
          name="minStretchPct"
          render={({ field, fieldState }) => (
            <TextField
              label="Minimum stretch (%)"
              hint="How far 10 cm of the fabric must stretch across the grain, e.g. 40 for 14 cm."
              value={field.value == null ? '' : String(field.value)}
              onChangeText={(text) => field.onChange(text.trim() === '' ? null : Number(text))}
              onBlur={field.onBlur}
              error={fieldState.error?.message}
              inputMode="numeric"
            />
          )}
        />
      ) : null}
      <Button label="Create pattern" busyLabel="Creating…" busy={formState.isSubmitting} onPress={submit} />
    </Card>
  );
}
