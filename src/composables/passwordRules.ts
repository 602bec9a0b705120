/** Shown beside every new-password field; the server enforces the same rule. */
export const PASSWORD_RULE_TEXT =
  'At least 10 characters, and not a common password. A few unrelated words work well.';

export const MIN_PASSWORD_LENGTH = 10;

export function passwordLengthRule(value: string | null | undefined): true | string {
  return (
    (value ?? '').length >= MIN_PASSWORD_LENGTH || `Use at least ${MIN_PASSWORD_LENGTH} characters.`
  );
}
