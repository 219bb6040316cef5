import { Controller, type Control, type FieldValues, type Path } from 'react-hook-form';
import type { TextInputProps } from 'react-native';
import { TextField } from '@/components/ui/text-field';

type Props<T extends FieldValues> = Omit<TextInputProps, 'value' | 'onChangeText' | 'onBlur' | 'style'> & {
  control: Control<T>;
  name: Path<T>;
  label: string;
  hint?: string;
};

/** A text field bound to a react-hook-form field, its error (from zod or the server) beside it. */
export function FormTextField<T extends FieldValues>({ control, name, label, hint, ...input }: Props<T>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          label={label}
          hint={hint}
          value={(field.value as string | null | undefined) ?? ''}
          onChangeText={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          {...input}
        />
      )}
    />
  );
}

/** The e-mail field every account form has. */
export const EMAIL_INPUT = { autoComplete: 'email', inputMode: 'email', autoCapitalize: 'none' } as const;
