import { reactive, ref } from 'vue';
import { isApiError } from '@/api/client';

/**
 * Puts server errors where the reader looks: beside the field the server named
 * (`details[].path`), otherwise in one message above the form's button.
 */
export function useFormErrors<F extends string>(fields: readonly F[]) {
  // Typed after creation: Reactive<> over a generic key set confuses the indexer.
  const fieldErrors = reactive<Record<string, string | undefined>>({}) as Record<
    F,
    string | undefined
  >;
  const formError = ref<string | null>(null);

  function clear(): void {
    for (const field of fields) fieldErrors[field] = undefined;
    formError.value = null;
  }

  /** Beside a labelled field, 'The field "email": must be…' reads better as 'Must be…'. */
  function besideField(message: string): string {
    const bare = message.replace(/^The field "[^"]*":\s*/, '');
    return bare.charAt(0).toUpperCase() + bare.slice(1);
  }

  function fieldFor(path: string): F | undefined {
    const head = path.split('.')[0];
    return fields.find((field) => field === head);
  }

  function apply(error: unknown): void {
    clear();
    if (!isApiError(error)) {
      formError.value = 'Something went wrong. Try again.';
      return;
    }
    let placed = false;
    for (const issue of error.details ?? []) {
      const field = fieldFor(issue.path);
      if (field) {
        const text = besideField(issue.message);
        fieldErrors[field] = fieldErrors[field] ? `${fieldErrors[field]} ${text}` : text;
        placed = true;
      }
    }
    if (!placed && error.code === 'VALIDATION') {
      // No details: the message names the field, so match it against ours.
      const named = fields.find((field) =>
        new RegExp(`\\b${field.replace(/([A-Z])/g, ' ?$1')}\\b`, 'i').test(error.message),
      );
      if (named) {
        fieldErrors[named] = besideField(error.message);
        placed = true;
      }
    }
    if (!placed) formError.value = error.message;
  }

  return { fieldErrors, formError, clear, apply };
}
