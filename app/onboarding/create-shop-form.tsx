'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input } from '@/components/ui/field';
import { ApiError, call } from '@/components/data/api';
import { createShop } from '@/server/api/routes/shop';

export function CreateShopForm() {
  const router = useRouter();
  const [name, setName] = useState('');
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="flex flex-col gap-2 rounded-2xl border border-line bg-surface p-6"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        try {
          // The shop's dates start in this browser's time zone; the owner can change it on the shop page.
          await call(createShop, { json: { name, timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone } });
          router.push('/jobs');
          router.refresh();
        } catch (err) {
          setError(err instanceof ApiError ? (err.fields.name ?? err.message) : 'Could not create the shop; try again.');
          setBusy(false);
        }
      }}
    >
      <Field id="shop-name" label="Shop name" error={error}>
        <Input id="shop-name" value={name} invalid={!!error} onChange={(e) => setName(e.target.value)} />
      </Field>
      <Button type="submit" disabled={busy}>
        Create my shop
      </Button>
    </form>
  );
}
