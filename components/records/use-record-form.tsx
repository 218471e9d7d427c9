'use client';

import { useState } from 'react';
import { useRouter } from 'next/navigation';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm, type DefaultValues, type FieldValues } from 'react-hook-form';
import type { z } from 'zod';
import { useMutation } from '@/components/data/use-mutation';
import { fieldsOf } from '@/components/ui/fields';
import type { RecordFormProps } from './record-form';

type Versioned = { id: string; version: number };

/**
 * A record form: react-hook-form validated by the shared zod schema, sent with the one mutation
 * hook (POST to create, PATCH with `version` to edit). The server's field errors land on the
 * fields; a 409 stale_version becomes a conflict notice that keeps what was typed.
 */
export function useRecordForm<V extends FieldValues, R extends Versioned>(options: {
  /** "sample": names the form ("New sample") and its button ("Add sample" / "Save sample"). */
  noun: string;
  /** The collection's URL, like /api/samples; a record is at /api/samples/<id>. */
  collection: string;
  /** The key of the record in the server's answer, like `sample`. */
  replyKey: string;
  /** The answer's contract, like `sampleReplies.one` (checked in development). */
  reply: z.ZodType;
  record?: R;
  schemas: { create: z.ZodType; update: z.ZodType };
  blank: V;
  toValues: (record: R) => V;
  /** Field name → label, for the conflict notice. */
  labels: Record<string, string>;
  /** Body to send from the parsed values (defaults to the values themselves). */
  toBody?: (values: FieldValues) => unknown;
  /** After a create; by default the form empties for the next record. */
  onCreated?: (record: R) => void;
}) {
  const { record, blank, toValues } = options;
  const router = useRouter();
  const editValues = (r: R) => ({ ...toValues(r), version: r.version }) as DefaultValues<V>;
  const form = useForm<V>({
    // The form holds the text typed; the schema's output (numbers, dates) is what is sent.
    resolver: zodResolver(
      (record ? options.schemas.update : options.schemas.create) as z.ZodType<V, V>,
    ),
    defaultValues: record ? editValues(record) : (blank as DefaultValues<V>),
  });
  // The server's field errors go on the form's own fields (never on `version`).
  const mutation = useMutation<Record<string, R>, V>({ form, fields: Object.keys(blank) });
  const [saved, setSaved] = useState(false);

  const onSubmit = form.handleSubmit(async (values) => {
    setSaved(false);
    const result = await mutation.run(
      record ? `${options.collection}/${record.id}` : options.collection,
      {
        method: record ? 'PATCH' : 'POST',
        json: options.toBody ? options.toBody(values) : values,
        schema: options.reply,
      },
    );
    if (!result.ok) return;
    const savedRecord = result.data[options.replyKey];
    setSaved(true);
    // The next edit starts from the version just saved, with the values as stored.
    if (record) form.reset(editValues(savedRecord));
    else if (options.onCreated) options.onCreated(savedRecord);
    else form.reset(blank as DefaultValues<V>);
    router.refresh();
  });

  const slug = options.noun.replace(/\s+/g, '-');
  const formProps: Omit<RecordFormProps, 'children'> = {
    noun: options.noun,
    editing: Boolean(record),
    onSubmit,
    submitting: form.formState.isSubmitting,
    labels: options.labels,
    conflict: mutation.conflict,
    onReapply: () => {
      mutation.resolveConflict();
      setSaved(false);
    },
    notice: mutation.message
      ? { tone: 'error', text: mutation.message }
      : saved
        ? { tone: 'success', text: 'Saved.' }
        : null,
  };
  return {
    form,
    field: fieldsOf(form, record ? `${slug}-${record.id}` : `${slug}-new`),
    formProps,
  };
}
