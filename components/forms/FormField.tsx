import type { ComponentProps } from 'react';
import { Controller, type Control, type FieldValues, type Path } from 'react-hook-form';

import { TextField } from './TextField';

type FieldProps<T extends FieldValues> = Omit<
  ComponentProps<typeof TextField>,
  'value' | 'onChangeText' | 'onBlur' | 'error' | 'ref'
> & {
  control: Control<T>;
  name: Path<T>;
};

/**
 * A TextField bound to a react-hook-form field, showing that field's error beneath it. The
 * input's ref goes to the form, which moves focus to the first field in error after a failed
 * submit (react-hook-form's `shouldFocusError`; applyServerErrors for the server's messages).
 */
export function FormField<T extends FieldValues>({ control, name, ...props }: FieldProps<T>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          {...props}
          ref={field.ref}
          value={typeof field.value === 'string' ? field.value : ''}
          onChangeText={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}
