import { useCallback, useRef, useState, type ChangeEvent, type FormEvent } from 'react';
import type { z } from 'zod';
import { ApiError, errorMessage } from './api';

export type FieldErrors = Record<string, string>;

/** First message per field path ("email", "address.city"), from a zod error. */
export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join('.') || '_form';
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

export interface ZodFormOptions<V> {
  /**
   * Turns the typed strings into what the schema takes (dollars to cents, "" to null...). Its
   * `errors` (by the same field names) are for text that could not be read at all; they are
   * shown together with the schema's own messages.
   */
  toInput?: (values: V) => { input: unknown; errors?: FieldErrors };
}

/**
 * Form state for a zod schema: string values, per-field messages, a form-level message.
 * Values are never cleared on an error; the first invalid field gets focus.
 */
export function useZodForm<S extends z.ZodType, V extends Record<string, string>>(schema: S, initial: V, options: ZodFormOptions<V> = {}) {
  const [values, setValues] = useState<V>(initial);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);

  const focusFirstInvalid = useCallback(() => {
    requestAnimationFrame(() => {
      const el = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
      el?.focus();
    });
  }, []);

  const setValue = useCallback((name: keyof V, value: string) => {
    setValues((prev) => ({ ...prev, [name]: value }));
    setErrors((prev) => {
      if (!(name in prev)) return prev;
      const next = { ...prev };
      delete next[name as string];
      return next;
    });
  }, []);

  /** Props for a TextField or Select bound to one value. */
  const field = (name: keyof V & string) => ({
    name,
    value: values[name],
    error: errors[name],
    onChange: (event: ChangeEvent<HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement>) =>
      setValue(name, event.target.value),
  });

  /** Parse the current values; on failure show the messages and return null. */
  const parse = (): z.output<S> | null => {
    const converted = options.toInput ? options.toInput(values) : { input: values, errors: {} };
    const unreadable = converted.errors ?? {};
    const result = schema.safeParse(converted.input);
    if (result.success && Object.keys(unreadable).length === 0) {
      setErrors({});
      setFormError(null);
      return result.data;
    }
    setErrors({ ...(result.success ? {} : zodFieldErrors(result.error)), ...unreadable });
    setFormError('Check the highlighted fields.');
    focusFirstInvalid();
    return null;
  };

  /** Show a failed request: its message and any per-field messages from the server. */
  const showError = (error: unknown) => {
    setFormError(errorMessage(error));
    if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
      setErrors(error.fields);
      focusFirstInvalid();
    }
  };

  const handleSubmit = (onValid: (data: z.output<S>) => void) => (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = parse();
    if (data !== null) onValid(data);
  };

  const reset = (next: V = initial) => {
    setValues(next);
    setErrors({});
    setFormError(null);
  };

  return { values, setValue, errors, setErrors, formError, setFormError, field, parse, showError, handleSubmit, reset, formRef };
}
