'use client';
/** Owners set the time zone every date is shown in and the temperature unit; the same zod schema as the route. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Notice, Select } from '@/components/ui/field';
import { api, ApiError } from '@/components/data/api';
import { type ShopSettings, shopSettingsSchema } from '@/domain/shop-settings';
import { timeZoneNames } from '@/domain/time';

export function ShopSettingsForm({ settings }: { settings: ShopSettings }) {
  const router = useRouter();
  const [note, setNote] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const { register, handleSubmit, formState, watch } = useForm<ShopSettings>({ resolver: zodResolver(shopSettingsSchema), defaultValues: settings });
  const zone = watch('timeZone');
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={handleSubmit(async (values) => {
        setNote(null);
        try {
          await api('/api/shop', { method: 'PATCH', json: values });
          setNote({ tone: 'ok', text: 'Saved: dates and temperatures now show this way for everyone in the shop.' });
          router.refresh();
        } catch (e) {
          setNote({ tone: 'error', text: e instanceof ApiError ? e.message : 'That did not save; try again.' });
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
      {note && <Notice tone={note.tone}>{note.text}</Notice>}
      <Button type="submit" disabled={formState.isSubmitting}>
        Save shop settings
      </Button>
    </form>
  );
}
