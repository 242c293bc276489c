import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import {
  useForm,
  type DefaultValues,
  type FieldValues,
  type Path,
  type Resolver,
} from 'react-hook-form';

import type { $ZodType } from 'zod/v4/core';

import { applyServerErrors } from './serverErrors';

interface ApiFormOptions<T extends FieldValues> {
  /** A zod/mini object schema of the form's values. */
  schema: $ZodType<T, FieldValues>;
  defaultValues: DefaultValues<T>;
  /** The fields a server message may name (`details[].path`). */
  fields: readonly Path<T>[];
  /** Sends the values; a throw shows the server's messages next to fields or on the form. */
  send: (values: T) => Promise<unknown>;
  /** Maps a server path to a field when the two are named differently. */
  fieldOf?: (serverPath: string) => string | undefined;
}

/**
 * One form that talks to the API: checked on the client first, disabled while sending, the
 * server's field messages put next to their fields, and `done` after a success.
 */
export function useApiForm<T extends FieldValues>(options: ApiFormOptions<T>) {
  const form = useForm<T>({
    resolver: zodResolver(options.schema) as unknown as Resolver<T>,
    defaultValues: options.defaultValues,
  });
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const handle = form.handleSubmit(async (values) => {
    setFormError(null);
    setDone(false);
    try {
      await options.send(values);
      setDone(true);
    } catch (error) {
      setFormError(applyServerErrors(error, options.fields, form.setError, options.fieldOf));
    }
  });
  return {
    form,
    control: form.control,
    submit: () => void handle(),
    sending: form.formState.isSubmitting,
    formError,
    done,
  };
}
