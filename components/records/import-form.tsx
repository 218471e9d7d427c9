'use client';

import { useState } from 'react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useMutation } from '@/components/data/use-mutation';
import { FormNotice, TextAreaField, fieldsOf } from '@/components/ui/fields';
import {
  IMPORT_TEMPLATE,
  importRequestSchema,
  importResponseSchema,
  type ImportIssue,
} from '@/lib/contracts/import';

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
  const importing = useMutation<{ imported: number }, Values>({ form, fields: ['csv'] });
  const [imported, setImported] = useState<number | null>(null);
  const issues = importing.error?.extra.issues;
  const listed = Array.isArray(issues) ? (issues as ImportIssue[]) : [];
  const message = importing.message
    ? { tone: 'error' as const, text: importing.message }
    : imported !== null
      ? {
          tone: 'success' as const,
          text: `Imported ${imported} ${imported === 1 ? 'drop' : 'drops'} into batch ${lotCode}.`,
        }
      : null;

  const onSubmit = form.handleSubmit(async ({ csv }) => {
    setImported(null);
    const result = await importing.run(`/api/batches/${batchId}/import`, {
      method: 'POST',
      json: { csv },
      schema: importResponseSchema,
    });
    if (!result.ok) return;
    setImported(result.data.imported);
    form.reset({ csv: '' });
    router.refresh();
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
      {listed.length > 0 ? (
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
              {listed.map((issue, index) => (
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
        label="…or paste the CSV text"
        rows={10}
        hint="Header row first. Comma, semicolon or tab separated; UTF-8."
        {...fieldsOf(form, 'import')('csv')}
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
