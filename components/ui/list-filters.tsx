'use client';

import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { CheckboxField, SelectField, TextField } from './fields';

export type FilterField =
  | { name: string; label: string; type: 'text' | 'date'; placeholder?: string }
  | {
      name: string;
      label: string;
      type: 'select';
      options: { value: string; label: string }[];
      all: string;
    }
  | { name: string; label: string; type: 'checkbox' };

/**
 * The filter bar of a list: its values are the URL's search params, so applying a filter makes
 * a link that can be shared. Applying returns to the first page; sort and hidden columns stay.
 */
export function ListFilters({ fields, label }: { fields: FilterField[]; label: string }) {
  const router = useRouter();
  const pathname = usePathname();
  const searchParams = useSearchParams();

  const apply = (data: FormData) => {
    const params = new URLSearchParams(searchParams.toString());
    for (const field of fields) {
      const value =
        field.type === 'checkbox'
          ? data.get(field.name)
            ? 'true'
            : ''
          : String(data.get(field.name) ?? '').trim();
      if (value) params.set(field.name, value);
      else params.delete(field.name);
    }
    params.delete('page');
    const query = params.toString();
    router.push(query ? `${pathname}?${query}` : pathname);
  };

  return (
    <form
      aria-label={label}
      className="mb-4 flex flex-wrap items-end gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        apply(new FormData(event.currentTarget));
      }}
      key={searchParams.toString()}
    >
      {fields.map((field) => {
        const common = { id: `filter-${field.name}`, name: field.name, label: field.label };
        const value = searchParams.get(field.name) ?? '';
        if (field.type === 'checkbox')
          return (
            <CheckboxField
              {...common}
              key={field.name}
              className="pb-2"
              defaultChecked={value === 'true' || value === '1'}
            />
          );
        if (field.type === 'select')
          return (
            <SelectField
              {...common}
              key={field.name}
              defaultValue={value}
              placeholder={field.all}
              options={field.options}
            />
          );
        return (
          <TextField
            {...common}
            key={field.name}
            type={field.type}
            defaultValue={value}
            placeholder={field.type === 'text' ? field.placeholder : undefined}
          />
        );
      })}
      <button type="submit" className="btn-quiet">
        Apply filters
      </button>
    </form>
  );
}
