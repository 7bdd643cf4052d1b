'use client';
/**
 * What the starting-system check needs that a capture cannot tell: a diesel engine (twice the cranking-current
 * allowance) and the air temperature (the cranking-voltage limit falls when colder), in the shop's unit. The
 * temperature is typed as a draft: applied on leaving the field or Enter when it is a number in range, its reason
 * shown when not; an empty field goes back to "about 21 °C".
 */
import { useState } from 'react';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { Field, Input } from '@/components/ui/field';
import { type AnalysisSettingsValues, analysisSettingsSchema } from '@/domain/analysis-settings';
import { temperatureFrom, temperatureIn } from '@/domain/units';
import { draftKeys } from './draft-number-field';

export function StartingConditions({ settings, onChange }: { settings: AnalysisSettingsValues; onChange: (s: AnalysisSettingsValues) => void }) {
  const { temperatureUnit: unit } = useShopSettings();
  const starting = settings.starting ?? {};
  const [draft, setDraft] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | undefined>();
  const shown = starting.temperatureC === undefined ? '' : String(temperatureIn(starting.temperatureC, unit));
  const apply = () => {
    if (draft === null) return;
    const t = draft.trim().replace(',', '.').replace('−', '-');
    const temperatureC = t === '' ? undefined : temperatureFrom(Number(t), unit);
    const next = { ...settings, starting: { ...starting, temperatureC } };
    const parsed = t === '' || /^-?\d+(\.\d+)?$/.test(t) ? analysisSettingsSchema.safeParse(next) : null;
    if (!parsed?.success) return setProblem(parsed ? parsed.error.issues[0].message : 'Enter a temperature, for example 5 or −10.');
    setProblem(undefined);
    setDraft(null);
    if (temperatureC !== starting.temperatureC) onChange(next);
  };
  return (
    <fieldset className="mt-2 flex flex-col gap-1 border-t border-line pt-2">
      <legend className="text-sm font-bold">Battery and starter check</legend>
      <label className="flex min-h-touch items-center gap-2 text-sm">
        <input type="checkbox" className="size-5" checked={!!starting.diesel} onChange={(ev) => onChange({ ...settings, starting: { ...starting, diesel: ev.target.checked || undefined } })} />
        Diesel engine
      </label>
      <Field id="s-air" label={`Air temperature (°${unit})`} error={problem} hint="Left empty: about 21 °C (70 °F).">
        <Input
          id="s-air"
          inputMode="decimal"
          className="figures"
          value={draft ?? shown}
          invalid={!!problem}
          onChange={(ev) => setDraft(ev.target.value)}
          onBlur={apply}
          onKeyDown={draftKeys(apply, () => {
            setDraft(null);
            setProblem(undefined);
          })}
        />
      </Field>
    </fieldset>
  );
}
