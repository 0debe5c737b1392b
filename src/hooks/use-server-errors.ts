import { useState } from 'react';
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { serverErrorMessage } from '@/lib/form-errors';

/**
 * What every form that sends to the server does with a refusal: the server's
 * field problems go to their fields, and what fits no field becomes the
 * form's own message. `send` runs one submission's request, clearing the
 * last message first, and resolves to whether the request succeeded, so a
 * form can still react to a failure (the sign-in form empties the password).
 */
export function useServerErrors<T extends FieldValues>(setError: UseFormSetError<T>, fields: readonly Path<T>[]) {
  const [formError, setFormError] = useState<string | null>(null);

  async function send(request: () => Promise<void>): Promise<boolean> {
    setFormError(null);
    try {
      await request();
      return true;
    } catch (error) {
      setFormError(serverErrorMessage(error, setError, fields));
      return false;
    }
  }

  return { formError, send };
}
