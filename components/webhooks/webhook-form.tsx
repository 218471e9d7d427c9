'use client';

import { useActionState } from 'react';
import { createWebhookAction } from '@/app/(app)/team/webhooks/actions';
import { answerField, FormMessages, ShownOnceField } from '@/components/auth/action-form';
import { initialFormState } from '@/components/auth/form-state';
import { CheckboxField, TextField } from '@/components/ui/fields';
import {
  WEBHOOK_EVENT_LABELS,
  WEBHOOK_EVENT_TYPES,
  webhookEventField,
} from '@/lib/contracts/webhooks';

/** Registers a webhook; its signing secret is shown once, right here, after it is made. */
export function WebhookForm() {
  const [state, formAction, pending] = useActionState(createWebhookAction, initialFormState);
  const secret = state.notice ? state.values?.secret : undefined;
  const failed = Boolean(state.message || state.fields);
  return (
    <form action={formAction} className="space-y-3" noValidate key={state.notice ?? 'form'}>
      <div className="grid gap-3 sm:grid-cols-[2fr_1fr]">
        <TextField
          id="webhook-url"
          label="Receiving address"
          hint="https://… of your LIMS or integration; it must answer 2xx"
          autoComplete="off"
          inputMode="url"
          {...answerField(state, 'url', { clearOnNotice: true })}
        />
        <TextField
          id="webhook-description"
          label="What it is for"
          hint="Optional, e.g. LIMS release queue"
          autoComplete="off"
          {...answerField(state, 'description', { clearOnNotice: true })}
        />
      </div>
      <fieldset className="space-y-3">
        <legend className="mb-1 text-sm font-medium">Events</legend>
        {WEBHOOK_EVENT_TYPES.map((type) => (
          <CheckboxField
            key={type}
            id={`webhook-event-${type}`}
            name={webhookEventField(type)}
            label={`${WEBHOOK_EVENT_LABELS[type]} — ${type}`}
            defaultChecked={failed ? Boolean(state.values?.[webhookEventField(type)]) : true}
          />
        ))}
        {state.fields?.events ? <p className="field-error">{state.fields.events}</p> : null}
      </fieldset>
      <FormMessages state={state} />
      {secret ? <ShownOnceField id="webhook-secret" label="Signing secret" value={secret} /> : null}
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? 'Registering…' : 'Register webhook'}
      </button>
    </form>
  );
}
