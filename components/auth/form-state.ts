/** What an auth form's server action hands back when it does not redirect. */
export type FormState = {
  message?: string;
  code?: string;
  fields?: Record<string, string>;
  values?: Record<string, string>;
};

export const initialFormState: FormState = {};
