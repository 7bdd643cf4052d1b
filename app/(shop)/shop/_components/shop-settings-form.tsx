'use client';
/** Owners set the time zone, the units, how customers reach the shop and the starting-system limits; the same zod schema as the route. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Notice, Select, TextArea } from '@/components/ui/field';
import { call, errorText } from '@/components/data/api';
import { type ShopSettings, type ShopSettingsInput, shopSettingsSchema } from '@/domain/shop-settings';
import { DEFAULT_STARTING_LIMITS, LIMIT_SOURCES } from '@/domain/starting-limits';
import { typedDecimal } from '@/domain/typed-number';
import type { z } from 'zod';
import { timeZoneNames } from '@/domain/time';
import { updateShop } from '@/server/api/routes/shop';

export function ShopSettingsForm({ settings }: { settings: ShopSettings }) {
  const router = useRouter();
  const [note, setNote] = useState<{ tone: 'ok' | 'error'; text: string } | null>(null);
  const { register, handleSubmit, formState, watch } = useForm<z.input<typeof shopSettingsSchema>, unknown, ShopSettingsInput>({ resolver: zodResolver(shopSettingsSchema), defaultValues: settings });
  const zone = watch('timeZone');
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={handleSubmit(async (values) => {
        setNote(null);
        try {
          await call(updateShop, { json: values });
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
      <Field id="pressure-unit" label="Pressure" error={formState.errors.pressureUnit?.message} hint="Gauge readings are typed, and estimated gauge pressures shown, in this unit.">
        <Select id="pressure-unit" defaultValue={settings.pressureUnit} {...register('pressureUnit')}>
          <option value="kPa">kPa (kilopascals)</option>
          <option value="psi">psi (pounds per square inch)</option>
          <option value="bar">bar</option>
        </Select>
      </Field>
      <fieldset className="flex flex-col gap-2 rounded border border-line p-3">
        <legend className="px-1 font-bold">Starting-system limits (12 V; a 24 V system doubles the voltages)</legend>
        {LIMIT_FIELDS.map((f) => (
          <Field key={f.key} id={`limit-${f.key}`} label={f.label} error={formState.errors.startingLimits?.[f.key]?.message} hint={hintOf(f)}>
            <Input id={`limit-${f.key}`} inputMode="decimal" className="figures" invalid={!!formState.errors.startingLimits?.[f.key]} {...register(`startingLimits.${f.key}`, { setValueAs: typedNumber })} />
          </Field>
        ))}
      </fieldset>
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

/** Each limit's field; its hint names the default (the engine's own, signal/starting/limits.ts) and where it comes from. */
const LIMIT_FIELDS: { key: keyof ShopSettings['startingLimits']; label: string; unit: string; source: string }[] = [
  { key: 'restingMinV', label: 'Lowest resting voltage (V)', unit: 'V', source: LIMIT_SOURCES.resting },
  { key: 'crankingMinV', label: 'Lowest voltage while cranking, at about 21 °C (V)', unit: 'V', source: LIMIT_SOURCES.crankingVoltage },
  { key: 'internalMaxMilliOhm', label: 'Highest battery resistance (mΩ)', unit: 'mΩ', source: LIMIT_SOURCES.internalResistance },
  { key: 'currentBaseA', label: 'Cranking current: base (A)', unit: 'A', source: 'with the next, the most a petrol engine may draw (twice for a diesel)' },
  { key: 'currentPerLitreA', label: 'Cranking current: per litre of displacement (A)', unit: 'A', source: LIMIT_SOURCES.crankingCurrent },
  { key: 'crankingMinRpm', label: 'Slowest cranking speed (rpm)', unit: 'rpm', source: LIMIT_SOURCES.crankingSpeed },
];
const hintOf = (f: (typeof LIMIT_FIELDS)[number]) => `Default ${DEFAULT_STARTING_LIMITS[f.key]} ${f.unit}; ${f.source}.`;

/** A typed number as the schema takes it: an empty field is not a number either (and is named). */
const typedNumber = (v: unknown): number => typedDecimal(v) ?? Number.NaN;
