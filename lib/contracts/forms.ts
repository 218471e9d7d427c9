/** What a form's server action hands back when it does not redirect. */
export type FormState = {
  message?: string;
  /** A calm confirmation (not an error), e.g. "we sent you a link". */
  notice?: string;
  code?: string;
  fields?: Record<string, string>;
  values?: Record<string, string>;
};

export const initialFormState: FormState = {};
