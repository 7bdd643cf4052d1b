'use client';
/**
 * Owners take the shop's data with them (one zip) or remove the shop: typing its name is the confirmation, and
 * the sentence says what goes.
 */
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { removeShop } from '@/server/api/routes/shop';

export function ShopData({ name }: { name: string }) {
  const [error, setError] = useState<string | null>(null);
  const { register, handleSubmit, formState, watch } = useForm<{ confirmName: string }>({ defaultValues: { confirmName: '' } });
  const typed = watch('confirmName');
  return (
    <div className="flex flex-col gap-4">
      <div>
        <a className="font-bold text-brand underline" href="/api/shop/export" download>
          Download all of this shop’s data (zip)
        </a>
        <p className="text-sm text-muted">Every job with its vehicle, captures as uploaded, analyses, report revisions and answers, and the signed reports as PDFs.</p>
      </div>
      <form
        className="flex flex-col gap-3 rounded-xl border-2 border-danger p-4"
        onSubmit={handleSubmit(async (v) => {
          setError(null);
          try {
            await call(removeShop, { json: v });
            window.location.assign('/');
          } catch (e) {
            setError(errorText(e, 'The shop was not removed; try again.'));
          }
        })}
      >
        <h3 className="font-bold text-danger">Remove this shop</h3>
        <p className="text-sm">
          Removes every job, capture (in object storage too), analysis, report, member, setting and activity line of “{name}”. It cannot be undone: download the
          data first.
        </p>
        <Field id="confirm-shop-name" label={`Type the shop’s name (“${name}”) to remove it`}>
          <Input id="confirm-shop-name" autoComplete="off" {...register('confirmName')} />
        </Field>
        {error && <Notice tone="error">{error}</Notice>}
        <Button type="submit" variant="danger" disabled={formState.isSubmitting || typed.trim() !== name.trim()}>
          Remove the shop and all its data
        </Button>
      </form>
    </div>
  );
}
