'use client';

import { useState } from 'react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { FormNotice, TextAreaField } from '@/components/ui/form-field';
import { IMPORT_TEMPLATE, importRequestSchema, type ImportIssue } from '@/lib/contracts/import';
import { RecordApiError, sendJson } from './api';

type Values = { csv: string };

/**
 * Pastes or loads a CSV of hand-read angles; the server checks every row and imports all of
 * them or none, answering with every problem (row and column) when there are any.
 */
export function ImportForm({ batchId, lotCode }: { batchId: string; lotCode: string }) {
  const router = useRouter();
  const form = useForm<Values>({
    resolver: zodResolver(importRequestSchema),
    defaultValues: { csv: '' },
  });
  const [issues, setIssues] = useState<ImportIssue[]>([]);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const onSubmit = form.handleSubmit(async ({ csv }) => {
    setIssues([]);
    setMessage(null);
    try {
      const body = await sendJson<{ imported: number }>(`/api/batches/${batchId}/import`, 'POST', {
        csv,
      });
      setMessage({
        tone: 'success',
        text: `Imported ${body.imported} ${body.imported === 1 ? 'drop' : 'drops'} into batch ${lotCode}.`,
      });
      form.reset({ csv: '' });
      router.refresh();
    } catch (error) {
      if (!(error instanceof RecordApiError)) throw error;
      const listed = error.body?.issues;
      if (Array.isArray(listed)) setIssues(listed as ImportIssue[]);
      const field = error.body?.error.fields?.csv;
      if (field) form.setError('csv', { type: 'server', message: field });
      setMessage({ tone: 'error', text: error.message });
    }
  });

  const loadFile = async (file: File | undefined) => {
    if (!file) return;
    form.setValue('csv', await file.text(), { shouldValidate: true });
  };

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Import angles">
      {message ? (
        <FormNotice tone={message.tone}>
          {message.text}{' '}
          {message.tone === 'success' ? (
            <Link className="font-medium underline" href={`/batches/${batchId}`}>
              Back to the batch
            </Link>
          ) : null}
        </FormNotice>
      ) : null}
      {issues.length > 0 ? (
        <div className="overflow-x-auto rounded-lg border border-coral-500 bg-white">
          <table className="min-w-full text-sm" aria-label="Problems in the file">
            <thead className="bg-coral-50 text-left">
              <tr>
                <th className="px-3 py-2">Row</th>
                <th className="px-3 py-2">Column</th>
                <th className="px-3 py-2">Problem</th>
              </tr>
            </thead>
            <tbody>
              {issues.map((issue, index) => (
                <tr key={index} className="border-t border-ink-100" data-testid="import-issue">
                  <td className="px-3 py-2 font-mono">{issue.row}</td>
                  <td className="px-3 py-2">{issue.column}</td>
                  <td className="px-3 py-2">{issue.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      <div>
        <label htmlFor="import-file" className="field-label">
          CSV file
        </label>
        <input
          id="import-file"
          type="file"
          accept=".csv,text/csv,text/plain"
          className="mt-1 block text-sm"
          onChange={(event) => loadFile(event.target.files?.[0])}
        />
      </div>
      <TextAreaField
        form={form}
        formId="import"
        name="csv"
        label="…or paste the CSV text"
        rows={10}
        hint="Header row first. Comma, semicolon or tab separated; UTF-8."
      />
      <div className="flex flex-wrap gap-2">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          Check and import
        </button>
        <button
          type="button"
          className="btn-quiet"
          onClick={() => form.setValue('csv', IMPORT_TEMPLATE)}
        >
          Start from the template
        </button>
      </div>
    </form>
  );
}
