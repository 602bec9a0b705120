// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { effectScope, nextTick } from 'vue';
import { ApiError } from '@/api/client';
import { useFormErrors } from '@/composables/useFormErrors';
import { useResource } from '@/composables/useResource';
import { linkifyMailText } from '@/pages/dev/linkify';

describe('linkifyMailText', () => {
  it('links only addresses on this site, as in-app paths', () => {
    const text =
      'Confirm my address: http://localhost:3000/verify-email?token=abc.\nElsewhere: https://other.example/x';
    const segments = linkifyMailText(text, 'http://localhost:3000');
    const links = segments.filter((s) => s.kind === 'link');
    expect(links).toEqual([
      {
        kind: 'link',
        text: 'http://localhost:3000/verify-email?token=abc',
        path: '/verify-email?token=abc',
      },
    ]);
    expect(segments.map((s) => s.text).join('')).toBe(text);
  });
});

describe('useFormErrors', () => {
  it('puts details beside their fields and names the field from the message otherwise', () => {
    const form = useFormErrors(['email', 'displayName', 'password'] as const);
    form.apply(
      new ApiError({
        status: 400,
        code: 'VALIDATION',
        message: 'x',
        details: [{ path: 'password', message: 'That password is too common.' }],
      }),
    );
    expect(form.fieldErrors.password).toBe('That password is too common.');
    expect(form.formError.value).toBeNull();

    form.apply(
      new ApiError({ status: 400, code: 'VALIDATION', message: 'The display name is too short.' }),
    );
    expect(form.fieldErrors.password).toBeUndefined();
    expect(form.fieldErrors.displayName).toBe('The display name is too short.');

    form.apply(
      new ApiError({
        status: 400,
        code: 'VALIDATION',
        message: 'The field "email": must be a valid e-mail address, like name@example.test.',
        details: [
          {
            path: 'email',
            message: 'The field "email": must be a valid e-mail address, like name@example.test.',
          },
        ],
      }),
    );
    expect(form.fieldErrors.email).toBe('Must be a valid e-mail address, like name@example.test.');

    form.apply(new ApiError({ status: 429, code: 'THROTTLED', message: 'Wait a minute.' }));
    expect(form.formError.value).toBe('Wait a minute.');
  });
});

describe('useResource', () => {
  it('gives data, loading and error, and a slow old answer never wins over a newer one', async () => {
    const scope = effectScope();
    const answers: Array<(v: string) => void> = [];
    const resource = scope.run(() =>
      useResource(
        (signal) =>
          new Promise<string>((resolve, reject) => {
            answers.push(resolve);
            signal.addEventListener('abort', () =>
              reject(new DOMException('aborted', 'AbortError')),
            );
          }),
      ),
    )!;
    expect(resource.loading.value).toBe(true);
    void resource.reload();
    answers[1]('new');
    await nextTick();
    await Promise.resolve();
    answers[0]('old');
    await nextTick();
    expect(resource.data.value).toBe('new');
    expect(resource.loading.value).toBe(false);
    expect(resource.error.value).toBeNull();
    scope.stop();
  });

  it('keeps the ApiError of a failed load', async () => {
    const scope = effectScope();
    const failure = new ApiError({ status: 404, code: 'NOT_FOUND', message: 'Nothing here.' });
    const resource = scope.run(() => useResource(() => Promise.reject(failure)))!;
    await resource.reload();
    expect(resource.error.value).toBe(failure);
    expect(resource.data.value).toBeNull();
    scope.stop();
  });
});
