'use client';
/** The new-job form: react-hook-form with the same zod schema as the route; each wrong field says why. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { type FieldPath, useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { LayoutOptions } from '@/components/ui/engine-options';
import { Field, Input, Notice, Select, TextArea } from '@/components/ui/field';
import { ApiError } from '@/components/data/api';
import { useCreateJob } from '@/components/data/jobs/create-job-mutation';
import { useVehicles } from '@/components/data/vehicles/use-vehicles';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { type JobInput, type JobValues, jobSchema } from '@/domain/job';
import { vehicleTitle } from '@/domain/vehicle';

interface Profile {
  key: string;
  label: string;
  cylinders: number;
  layout: string;
  numbering: string;
  firingOrder: string;
}

export function NewJobForm({ profiles }: { profiles: Profile[] }) {
  const router = useRouter();
  const create = useCreateJob();
  const vehicles = useVehicles();
  const [mode, setMode] = useState<'new' | 'existing'>('new');
  const [formError, setFormError] = useState<string | null>(null);
  const { distanceUnit } = useShopSettings();
  const form = useForm<JobInput, unknown, JobValues>({
    resolver: zodResolver(jobSchema),
    defaultValues: {
      repairOrder: '',
      odometerUnit: distanceUnit,
      concern: '',
      vehicle: { vin: '', make: '', model: '', engine: { cylinders: 4, layout: 'inline', numbering: 'along-crank', firingOrder: '1-3-4-2' } },
    },
  });
  const { register, handleSubmit, formState, setValue, setError, unregister } = form;
  const e = formState.errors;
  const ve = e.vehicle;

  function applyProfile(key: string) {
    const p = profiles.find((x) => x.key === key);
    if (!p) return;
    setValue('vehicle.engine.cylinders', p.cylinders);
    setValue('vehicle.engine.layout', p.layout as 'inline');
    setValue('vehicle.engine.numbering', p.numbering as 'along-crank');
    setValue('vehicle.engine.firingOrder', p.firingOrder);
  }

  async function submit(values: JobValues) {
    setFormError(null);
    try {
      const job = await create.mutateAsync(values as unknown as JobInput);
      router.push(`/jobs/${job.id}`);
    } catch (err) {
      if (err instanceof ApiError) {
        for (const [path, message] of Object.entries(err.fields)) setError(path as FieldPath<JobInput>, { message });
        setFormError(err.message);
      } else setFormError('Could not save the job; check the connection and try again.');
    }
  }

  return (
    <form onSubmit={handleSubmit(submit)} className="flex flex-col gap-4" noValidate>
      {formError && <Notice tone="error">{formError}</Notice>}
      <fieldset className="grid gap-x-4 rounded-2xl border border-line bg-surface p-5 md:grid-cols-3">
        <legend className="px-1 text-lg font-bold">Repair order</legend>
        <Field id="repairOrder" label="Repair-order number" error={e.repairOrder?.message}>
          <Input id="repairOrder" className="figures" invalid={!!e.repairOrder} {...register('repairOrder')} />
        </Field>
        <Field id="odometer" label="Odometer" error={e.odometer?.message}>
          <Input id="odometer" inputMode="numeric" className="figures" invalid={!!e.odometer} {...register('odometer')} />
        </Field>
        <Field id="odometerUnit" label="Unit">
          <Select id="odometerUnit" {...register('odometerUnit')}>
            <option value="km">km</option>
            <option value="mi">miles</option>
          </Select>
        </Field>
        <div className="md:col-span-3">
          <Field id="concern" label="Customer concern, in their words" error={e.concern?.message}>
            <TextArea id="concern" invalid={!!e.concern} {...register('concern')} />
          </Field>
        </div>
      </fieldset>

      <fieldset className="rounded-2xl border border-line bg-surface p-5">
        <legend className="px-1 text-lg font-bold">Vehicle</legend>
        <div role="radiogroup" aria-label="Vehicle" className="mb-3 flex gap-2">
          {(['new', 'existing'] as const).map((m) => (
            <button
              key={m}
              type="button"
              role="radio"
              aria-checked={mode === m}
              onClick={() => {
                setMode(m);
                if (m === 'existing') {
                  unregister('vehicle');
                } else {
                  unregister('vehicleId');
                }
              }}
              className={`min-h-touch rounded-lg border px-3 font-bold ${mode === m ? 'border-brand bg-brand text-brand-ink' : 'border-line'}`}
            >
              {m === 'new' ? 'New vehicle' : 'A vehicle already in the shop'}
            </button>
          ))}
        </div>
        {mode === 'existing' ? (
          <Field id="vehicleId" label="Vehicle" error={e.vehicleId?.message ?? ve?.message}>
            <Select id="vehicleId" invalid={!!e.vehicleId} {...register('vehicleId')}>
              <option value="">Choose…</option>
              {(vehicles.data ?? []).map((v) => (
                <option key={v.id} value={v.id}>
                  {vehicleTitle(v)} {v.vin ? `· ${v.vin}` : ''}
                </option>
              ))}
            </Select>
          </Field>
        ) : (
          <div className="grid gap-x-4 md:grid-cols-4">
            <div className="md:col-span-2">
              <Field id="vin" label="VIN" hint="17 characters; the check digit is verified where the rule applies." error={ve?.vin?.message}>
                <Input id="vin" className="figures uppercase" autoComplete="off" invalid={!!ve?.vin} {...register('vehicle.vin')} />
              </Field>
            </div>
            <Field id="year" label="Year" error={ve?.year?.message}>
              <Input id="year" inputMode="numeric" className="figures" invalid={!!ve?.year} {...register('vehicle.year')} />
            </Field>
            <div />
            <Field id="make" label="Make" error={ve?.make?.message}>
              <Input id="make" invalid={!!ve?.make} {...register('vehicle.make')} />
            </Field>
            <Field id="model" label="Model" error={ve?.model?.message}>
              <Input id="model" invalid={!!ve?.model} {...register('vehicle.model')} />
            </Field>
            <div className="md:col-span-2">
              <Field id="profile" label="Engine profile" hint="Fills the engine below; check it against the service information.">
                <Select id="profile" defaultValue="i4" onChange={(ev) => applyProfile(ev.target.value)}>
                  {profiles.map((p) => (
                    <option key={p.key} value={p.key}>
                      {p.label}
                    </option>
                  ))}
                </Select>
              </Field>
            </div>
            <Field id="cylinders" label="Cylinders" error={ve?.engine?.cylinders?.message}>
              <Input id="cylinders" inputMode="numeric" className="figures" invalid={!!ve?.engine?.cylinders} {...register('vehicle.engine.cylinders')} />
            </Field>
            <Field id="layout" label="Layout" error={ve?.engine?.layout?.message}>
              <Select id="layout" {...register('vehicle.engine.layout')}>
                <LayoutOptions />
              </Select>
            </Field>
            <Field id="firingOrder" label="Firing order" error={ve?.engine?.firingOrder?.message}>
              <Input id="firingOrder" className="figures" invalid={!!ve?.engine?.firingOrder} {...register('vehicle.engine.firingOrder')} />
            </Field>
            <Field id="displacement" label="Displacement (L)" error={ve?.engine?.displacementL?.message}>
              <Input id="displacement" inputMode="decimal" className="figures" invalid={!!ve?.engine?.displacementL} {...register('vehicle.engine.displacementL', { setValueAs: (v) => (v === '' ? undefined : v) })} />
            </Field>
            <div className="md:col-span-2">
              <Field id="numbering" label="Cylinder numbering (V and flat engines)">
                <Select id="numbering" {...register('vehicle.engine.numbering')}>
                  <option value="along-crank">Along the crank: odd numbers on one bank</option>
                  <option value="bank-by-bank">Bank by bank: first bank, then second</option>
                </Select>
              </Field>
            </div>
          </div>
        )}
      </fieldset>
      <div>
        <Button type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : 'Create job'}
        </Button>
      </div>
    </form>
  );
}
