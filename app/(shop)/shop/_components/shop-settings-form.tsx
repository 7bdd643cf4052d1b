'use client';
/** Owners set the time zone, the units and how customers reach the shop; the same zod schema as the route. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select, TextArea } from '@/components/ui/field';
import { api, errorText } from '@/components/data/api';
import { type ShopSettings, shopSettingsSchema } from '@/domain/shop-settings';
import type { z } from 'zod';
import { timeZoneNames } from '@/domain/time';

export function ShopSettingsForm({ settings }: { settings: ShopSettings }) {
  const router = useRouter();
  const [note, setNote] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const { register, handleSubmit, formState, watch } = useForm<z.input<typeof shopSettingsSchema>, unknown, ShopSettings>({ resolver: zodResolver(shopSettingsSchema), defaultValues: settings });
  const zone = watch('timeZone');
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={handleSubmit(async (values) => {
        setNote(null);
        try {
          await api('/api/shop', { method: 'PATCH', json: values });
          setNote({ tone: 'ok', text: 'Saved: dates, temperatures and distances now show this way for everyone in the shop, and customers see the phone and address.' });
          router.refresh();
        } catch (e) {
          setNote({ tone: 'error', text: errorText(e, 'That did not save; try again.') });
        }
      })}
    >
      <Field id="time-zone" label="Time zone" error={formState.errors.timeZone?.message} hint={`Pages, e-mail and report PDFs show dates in ${zone || 'UTC'}, with the zone named.`}>
        <Select id="time-zone" defaultValue={settings.timeZone} {...register('timeZone')}>
          {timeZoneNames().map((z) => (
            <option key={z} value={z}>
              {z}
            </option>
          ))}
        </Select>
      </Field>
      <Field id="temperature-unit" label="Temperature" error={formState.errors.temperatureUnit?.message}>
        <Select id="temperature-unit" defaultValue={settings.temperatureUnit} {...register('temperatureUnit')}>
          <option value="C">°C (degrees Celsius)</option>
          <option value="F">°F (degrees Fahrenheit)</option>
        </Select>
      </Field>
      <Field id="distance-unit" label="Distance" error={formState.errors.distanceUnit?.message} hint="The odometer unit a new job starts with; each job can still say otherwise.">
        <Select id="distance-unit" defaultValue={settings.distanceUnit} {...register('distanceUnit')}>
          <option value="km">km (kilometres)</option>
          <option value="mi">mi (miles)</option>
        </Select>
      </Field>
      <Field id="shop-phone" label="Phone for customers" error={formState.errors.phone?.message} hint="Shown on the customer’s report page beside the buttons, so they can call before they answer.">
        <Input id="shop-phone" type="tel" autoComplete="tel" invalid={!!formState.errors.phone} {...register('phone')} />
      </Field>
      <Field id="shop-address" label="Address" error={formState.errors.address?.message} hint="Shown on the customer’s report page, line by line as typed.">
        <TextArea id="shop-address" rows={3} invalid={!!formState.errors.address} {...register('address')} />
      </Field>
      {note && <Notice tone={note.tone}>{note.text}</Notice>}
      <Button type="submit" disabled={formState.isSubmitting}>
        Save shop settings
      </Button>
    </form>
  );
}
