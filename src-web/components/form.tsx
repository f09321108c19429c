import { zodResolver } from '@hookform/resolvers/zod';
import { Field, Input, MessageBar, MessageBarBody, type InputProps } from '@fluentui/react-components';
import type { ReactNode } from 'react';
import {
  FormProvider,
  useController,
  useForm,
  useFormContext,
  type DefaultValues,
  type FieldValues,
  type Path,
  type SubmitHandler,
  type UseFormReturn,
} from 'react-hook-form';
import type { z } from 'zod';
import { ApiError } from '../lib/api-client';

interface FormProps<T extends FieldValues> {
  schema: z.ZodType<T, FieldValues>;
  defaultValues?: DefaultValues<T>;
  onSubmit: (values: T, form: UseFormReturn<T>) => Promise<unknown> | unknown;
  children: (form: UseFormReturn<T>) => ReactNode;
  className?: string;
  id?: string;
  'aria-label'?: string;
}

/**
 * The one form wrapper: react-hook-form with the shared zod schema, and API field errors
 * (400 `fields`) mapped back onto the inputs; other errors show above the form.
 */
export function Form<T extends FieldValues>({ schema, defaultValues, onSubmit, children, className, id, ...rest }: FormProps<T>) {
  const form = useForm<T>({ resolver: zodResolver(schema as never) as never, defaultValues, mode: 'onTouched' });
  const submit: SubmitHandler<T> = async (values) => {
    try {
      await onSubmit(values, form);
    } catch (err) {
      if (err instanceof ApiError && err.fields && Object.keys(err.fields).length) {
        for (const [name, message] of Object.entries(err.fields)) form.setError(name as Path<T>, { type: 'server', message });
        if (err.fields._) form.setError('root', { type: 'server', message: err.fields._ });
      } else {
        form.setError('root', { type: 'server', message: err instanceof Error ? err.message : 'Something went wrong' });
      }
    }
  };
  const rootError = form.formState.errors.root?.message;
  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={form.handleSubmit(submit)} className={className} id={id} aria-label={rest['aria-label']}>
        {rootError ? (
          <MessageBar intent="error" role="alert" style={{ marginBottom: 12 }}>
            <MessageBarBody>{rootError}</MessageBarBody>
          </MessageBar>
        ) : null}
        {children(form)}
      </form>
    </FormProvider>
  );
}

interface TextFieldProps extends Omit<InputProps, 'name' | 'value' | 'onChange' | 'defaultValue'> {
  name: string;
  label: string;
  hint?: string;
  required?: boolean;
}

/** A labelled input bound to the surrounding Form, with its inline error. */
export function TextField({ name, label, hint, required, ...input }: TextFieldProps) {
  const { control } = useFormContext();
  const { field, fieldState } = useController({ name, control });
  return (
    <Field
      label={label}
      hint={hint}
      required={required}
      validationState={fieldState.error ? 'error' : 'none'}
      validationMessage={fieldState.error?.message}
    >
      <Input
        {...input}
        name={field.name}
        value={(field.value as string | undefined) ?? ''}
        onChange={(_, d) => field.onChange(d.value)}
        onBlur={field.onBlur}
        ref={field.ref}
      />
    </Field>
  );
}
