'use client';
/**
 * One gauge reading and the specification, in the shop's pressure unit, and every cylinder's estimated gauge
 * pressure from it. What is typed stays a draft until it is a whole, valid reading: a half-typed number changes
 * nothing in the report, and says what is wrong beside the field.
 */
import { useState } from 'react';
import { useShopSettings } from '@/components/shop/shop-settings-context';
import { Field, Input, Notice, Select } from '@/components/ui/field';
import { ESTIMATE_CAUTION, type GaugeReading, gaugePressures, gaugeSchema, gaugeSummary } from '@/domain/gauge-pressures';
import { typedDecimal } from '@/domain/typed-number';
import { pressureFrom, pressureIn } from '@/domain/units';
import type { AnalysisResult } from '@/signal';

interface Drafts {
  cylinder: string;
  reading: string;
  accuracy: string;
  minimum: string;
  difference: string;
}

export function GaugeFields({ gauge, result, readOnly, onChange }: { gauge: GaugeReading | undefined; result: AnalysisResult | undefined; readOnly: boolean; onChange: (g: GaugeReading | undefined) => void }) {
  const { pressureUnit: unit } = useShopSettings();
  const shown = (kpa: number | undefined) => (kpa === undefined ? '' : String(pressureIn(kpa, unit)));
  const [d, setD] = useState<Drafts>({
    cylinder: gauge ? String(gauge.cylinder) : '',
    reading: shown(gauge?.readingKpa),
    accuracy: gauge ? String(gauge.accuracyPercent) : '2',
    minimum: shown(gauge?.minimumKpa),
    difference: gauge?.maxDifferencePercent === undefined ? '' : String(gauge.maxDifferencePercent),
  });
  const [errors, setErrors] = useState<Partial<Record<keyof Drafts, string>>>({});
  const FIELD: Record<string, keyof Drafts> = { cylinder: 'cylinder', readingKpa: 'reading', accuracyPercent: 'accuracy', minimumKpa: 'minimum', maxDifferencePercent: 'difference' };
  const update = (patch: Partial<Drafts>) => {
    const next = { ...d, ...patch };
    setD(next);
    if (next.cylinder === '' && next.reading.trim() === '' && next.minimum.trim() === '' && next.difference.trim() === '') {
      setErrors({});
      return onChange(undefined);
    }
    const reading = typedDecimal(next.reading);
    const minimum = typedDecimal(next.minimum);
    const parsed = gaugeSchema.safeParse({
      cylinder: next.cylinder === '' ? Number.NaN : Number(next.cylinder),
      readingKpa: reading === undefined ? Number.NaN : pressureFrom(reading, unit),
      accuracyPercent: typedDecimal(next.accuracy) ?? 0,
      minimumKpa: minimum === undefined ? undefined : pressureFrom(minimum, unit),
      maxDifferencePercent: typedDecimal(next.difference),
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [FIELD[String(i.path[0])], i.message])));
      return;
    }
    setErrors({});
    onChange(parsed.data);
  };
  const estimate = gauge && result ? gaugePressures(result, gauge) : null;
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-3 rounded-2xl border border-line bg-surface p-4" data-testid="gauge-fields">
      <legend className="px-1 text-lg font-bold">Gauge reading (optional)</legend>
      <p className="text-sm text-muted">Gauge one cylinder that has a figure: every other cylinder’s pressure is estimated from it. {ESTIMATE_CAUTION}</p>
      <div className="grid gap-x-3 md:grid-cols-3">
        <Field id="gauge-cylinder" label="Cylinder gauged" error={errors.cylinder}>
          <Select id="gauge-cylinder" value={d.cylinder} onChange={(e) => update({ cylinder: e.target.value })}>
            <option value="">none</option>
            {(result?.cylinders ?? []).map((c) => (
              <option key={c.cylinder} value={c.cylinder}>
                {c.cylinder}
              </option>
            ))}
          </Select>
        </Field>
        <Field id="gauge-reading" label={`Reading (${unit})`} error={errors.reading}>
          <Input id="gauge-reading" inputMode="decimal" className="figures" value={d.reading} invalid={!!errors.reading} onChange={(e) => update({ reading: e.target.value })} />
        </Field>
        <Field id="gauge-accuracy" label="Gauge accuracy (± %)" error={errors.accuracy}>
          <Input id="gauge-accuracy" inputMode="decimal" className="figures" value={d.accuracy} invalid={!!errors.accuracy} onChange={(e) => update({ accuracy: e.target.value })} />
        </Field>
        <Field id="gauge-minimum" label={`Specification: minimum (${unit})`} error={errors.minimum}>
          <Input id="gauge-minimum" inputMode="decimal" className="figures" value={d.minimum} invalid={!!errors.minimum} onChange={(e) => update({ minimum: e.target.value })} />
        </Field>
        <Field id="gauge-difference" label="Specification: largest difference (% of highest)" error={errors.difference} hint="Common practice: 25 (the lowest at least 75 % of the highest).">
          <Input id="gauge-difference" inputMode="decimal" className="figures" value={d.difference} invalid={!!errors.difference} onChange={(e) => update({ difference: e.target.value })} />
        </Field>
      </div>
      {estimate && 'problem' in estimate && <Notice tone="error">{estimate.problem}</Notice>}
      {estimate && !('problem' in estimate) && (
        <div data-testid="gauge-estimates">
          <table className="w-full text-sm">
            <thead>
              <tr className="text-left text-muted">
                <th className="py-1 font-normal">Cylinder</th>
                <th className="py-1 font-normal">Estimated ({unit})</th>
                <th className="py-1 font-normal">90 % range</th>
                <th className="py-1 font-normal">Against the minimum</th>
              </tr>
            </thead>
            <tbody>
              {estimate.cylinders.map((c) => (
                <tr key={c.cylinder} className="figures border-t border-line">
                  <td className="py-1">
                    {c.cylinder}
                    {c.gauged ? ' (gauged)' : ''}
                  </td>
                  <td className="py-1">{c.kpa === null ? '—' : pressureIn(c.kpa, unit)}</td>
                  <td className="py-1">{c.interval ? `${pressureIn(c.interval[0], unit)}–${pressureIn(c.interval[1], unit)}` : '—'}</td>
                  <td className="py-1">{gauge?.minimumKpa === undefined ? '—' : c.status}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-2 text-sm font-bold">
            {gaugeSummary(estimate)}
          </p>
        </div>
      )}
    </fieldset>
  );
}
