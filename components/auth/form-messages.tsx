import type { FormState } from './form-state';

/** The error (role=alert) and the calm notice (role=status) of an auth form. */
export function FormMessages({ state }: { state: FormState }) {
  return (
    <>
      {state.message ? (
        <p
          role="alert"
          className="rounded-md border border-coral-100 bg-coral-50 px-3 py-2 text-sm text-coral-900"
        >
          {state.message}
        </p>
      ) : null}
      {state.notice ? (
        <p
          role="status"
          className="rounded-md border border-leaf-100 bg-leaf-50 px-3 py-2 text-sm text-leaf-900"
        >
          {state.notice}
        </p>
      ) : null}
    </>
  );
}
