'use client';
/** The report's test conditions: typed by the technician, "not recorded" when left empty; coolant in the shop's unit. */
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { Field, Input, Select } from '@/components/ui/field';
import type { ReportContent } from '@/domain/report';
import { temperatureFrom, temperatureIn } from '@/domain/units';

type Conditions = ReportContent['conditions'];

export function ConditionFields({ conditions, readOnly, onChange }: { conditions: Conditions; readOnly: boolean; onChange: (patch: Partial<Conditions>) => void }) {
  const { temperatureUnit } = useShopSettings();
  return (
    <fieldset disabled={readOnly} className="grid gap-x-3 rounded-2xl border border-line bg-surface p-4 md:grid-cols-3">
      <legend className="px-1 text-lg font-bold">Test conditions</legend>
      <Field id="coolant" label={`Coolant (°${temperatureUnit})`}>
        <Input
          id="coolant"
          inputMode="decimal"
          className="figures"
          value={conditions.coolantTempC === undefined ? '' : temperatureIn(conditions.coolantTempC, temperatureUnit)}
          onChange={(e) => onChange({ coolantTempC: e.target.value === '' ? undefined : temperatureFrom(Number(e.target.value), temperatureUnit) })}
        />
      </Field>
      <Field id="rest" label="Battery at rest (V)">
        <Input id="rest" inputMode="decimal" className="figures" value={conditions.batteryRestV ?? ''} onChange={(e) => onChange({ batteryRestV: e.target.value === '' ? undefined : Number(e.target.value) })} />
      </Field>
      <Field id="crankv" label="Lowest cranking (V)">
        <Input id="crankv" inputMode="decimal" className="figures" value={conditions.lowestCrankingV ?? ''} onChange={(e) => onChange({ lowestCrankingV: e.target.value === '' ? undefined : Number(e.target.value) })} />
      </Field>
      <Field id="throttle" label="Throttle">
        <Select id="throttle" value={conditions.throttle ?? ''} onChange={(e) => onChange({ throttle: (e.target.value || undefined) as 'closed' })}>
          <option value="">not recorded</option>
          <option value="closed">closed</option>
          <option value="wide-open">wide open</option>
        </Select>
      </Field>
      <div className="md:col-span-2">
        <Field id="fuel" label="Fuel disabled by">
          <Input id="fuel" value={conditions.fuelDisabledBy ?? ''} placeholder="e.g. fuel pump fuse removed" onChange={(e) => onChange({ fuelDisabledBy: e.target.value || undefined })} />
        </Field>
      </div>
      <Field id="sync" label="Sync source">
        <Input id="sync" value={conditions.syncSource ?? ''} placeholder="e.g. cylinder 1 coil trigger" onChange={(e) => onChange({ syncSource: e.target.value || undefined })} />
      </Field>
      <div className="md:col-span-2">
        <Field id="numbering" label="Cylinder numbering convention">
          <Input id="numbering" value={conditions.numbering ?? ''} placeholder="as the service information numbers them" onChange={(e) => onChange({ numbering: e.target.value || undefined })} />
        </Field>
      </div>
    </fieldset>
  );
}
