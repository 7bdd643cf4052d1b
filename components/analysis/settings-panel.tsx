'use client';
/** Engine setup, method and limits. Every change re-runs the analysis in the worker at once. */
import { LayoutOptions } from '@/components/ui/engine-options';
import { Field, Input, Select } from '@/components/ui/field';
import { useState } from 'react';
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import { DraftNumberField } from './draft-number-field';
import { StartingConditions } from './starting-conditions';
import { firingOrderProblem, METHOD_CHOICES, methodLabel } from '@/signal';
import type { Method } from '@/signal';

export interface ProfileOption {
  key: string;
  label: string;
  engine: AnalysisSettingsValues['engine'];
}

const METHOD_OPTIONS: [Method, string][] = METHOD_CHOICES.filter((m) => m !== 'auto').map((m) => [m, methodLabel(m)]);

export function SettingsPanel({
  settings,
  onChange,
  profiles,
  identityAssumed,
  blocked,
}: {
  settings: AnalysisSettingsValues;
  onChange: (s: AnalysisSettingsValues) => void;
  profiles: ProfileOption[];
  identityAssumed: boolean;
  /** Methods the capture has no channel for, with the reason. */
  blocked?: Record<Method, string | null>;
}) {
  const e = settings.engine;
  const set = (patch: Partial<AnalysisSettingsValues>) => onChange({ ...settings, ...patch });
  const setEngine = (patch: Partial<AnalysisSettingsValues['engine']>) => set({ engine: { ...e, ...patch } });
  const orderText = e.firingOrder.join('-');
  // The firing order is typed as a draft too: applied when whole and valid, its reason shown when not.
  const [orderDraft, setOrderDraft] = useState<string | null>(null);
  const [orderProblem, setOrderProblem] = useState<string | null>(null);
  const applyOrder = () => {
    if (orderDraft === null) return;
    const order = orderDraft.split(/[\s,-]+/).filter(Boolean).map(Number);
    const problem = firingOrderProblem(order, e.cylinders);
    setOrderProblem(problem);
    if (problem) return;
    setOrderDraft(null);
    if (order.join('-') !== orderText) setEngine({ firingOrder: order });
  };
  return (
    <form className="flex flex-col gap-1" onSubmit={(ev) => ev.preventDefault()} aria-label="Analysis settings">
      <Field id="s-profile" label="Engine profile">
        <Select
          id="s-profile"
          value=""
          onChange={(ev) => {
            const p = profiles.find((x) => x.key === ev.target.value);
            if (p) set({ engine: p.engine, rotation: 0 });
          }}
        >
          <option value="">Apply a profile…</option>
          {profiles.map((p) => (
            <option key={p.key} value={p.key}>
              {p.label}
            </option>
          ))}
        </Select>
      </Field>
      <div className="grid grid-cols-2 gap-x-3">
        <Field id="s-cyl" label="Cylinders">
          <Input id="s-cyl" className="figures" value={e.cylinders} readOnly aria-readonly="true" />
        </Field>
        <Field id="s-layout" label="Layout">
          <Select id="s-layout" value={e.layout} onChange={(ev) => setEngine({ layout: ev.target.value as 'inline' })}>
            <LayoutOptions />
          </Select>
        </Field>
      </div>
      <Field id="s-order" label="Firing order" error={orderProblem ?? undefined} hint={e.intervalsDeg && new Set(e.intervalsDeg).size > 1 ? `Uneven firing: ${e.intervalsDeg.join('/')}°` : 'Even firing intervals'}>
        <Input
          id="s-order"
          className="figures"
          value={orderDraft ?? orderText}
          invalid={!!orderProblem}
          onChange={(ev) => {
            setOrderDraft(ev.target.value);
            setOrderProblem(null);
          }}
          onBlur={applyOrder}
          onKeyDown={(ev) => {
            if (ev.key === 'Enter') {
              ev.preventDefault();
              applyOrder();
            }
          }}
        />
      </Field>
      <Field id="s-method" label="Method">
        <Select id="s-method" value={settings.method} onChange={(ev) => set({ method: ev.target.value as 'auto' })}>
          <option value="auto">Automatic (from the channels)</option>
          {METHOD_OPTIONS.map(([value, label]) => (
            <option key={value} value={value} disabled={!!blocked?.[value] && settings.method !== value}>
              {blocked?.[value] ? `${label} — ${blocked[value]}` : label}
            </option>
          ))}
        </Select>
      </Field>
      <Field id="s-teeth" label="Tooth pattern" hint="Found from the gaps when left empty.">
        <Select id="s-teeth" value={settings.teeth ?? ''} onChange={(ev) => set({ teeth: ev.target.value || undefined })}>
          <option value="">Detect</option>
          {['60-2', '36-1', '36-2', '24-1', '12-1', '4-1'].map((t) => (
            <option key={t} value={t}>
              {t}
            </option>
          ))}
        </Select>
      </Field>
      <div className="grid grid-cols-2 gap-x-3">
        <DraftNumberField id="s-low" label="Low limit (%)" field="lowLimitPercent" settings={settings} onChange={onChange} />
        <DraftNumberField id="s-high" label="Upper limit (%)" field="highLimitPercent" settings={settings} onChange={onChange} />
        <DraftNumberField id="s-spread" label="Spread limit (%)" field="spreadLimitPercent" settings={settings} onChange={onChange} />
      </div>
      <StartingConditions settings={settings} onChange={onChange} />
      {identityAssumed && (
        <div className="rounded-lg bg-raised p-3">
          <p className="text-sm">Without sync the first event is taken as cylinder {e.firingOrder[0]}. Step the assignment along the firing order:</p>
          <div className="mt-2 flex items-center gap-2">
            <button type="button" className="min-h-touch min-w-touch rounded-lg border border-line font-bold" aria-label="Rotate assignment back" onClick={() => set({ rotation: settings.rotation - 1 })}>
              ←
            </button>
            <span className="figures flex-1 text-center">step {settings.rotation}</span>
            <button type="button" className="min-h-touch min-w-touch rounded-lg border border-line font-bold" aria-label="Rotate assignment on" onClick={() => set({ rotation: settings.rotation + 1 })}>
              →
            </button>
          </div>
        </div>
      )}
      {settings.window && (
        <button type="button" className="mt-2 min-h-touch rounded-lg border border-line px-3 text-left font-bold" onClick={() => set({ window: undefined })}>
          Cranking window set by hand (<span className="figures">{settings.window.startS.toFixed(2)}–{settings.window.endS.toFixed(2)} s</span>): reset to automatic
        </button>
      )}
    </form>
  );
}
