'use client';
/** When the channel sniff is unsure: a preview of the first rows and a role per column. */
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Select } from '@/components/ui/field';
import type { ChannelRole } from '@/signal';
import type { ImportSummary } from '@/workers/analysis-api';

const ROLE_LABEL: Record<ChannelRole, string> = {
  time: 'Time',
  current: 'Starter current (A)',
  crank: 'Crank sensor (V)',
  sync: 'Cylinder 1 sync (V)',
  rpm: 'Engine speed (rpm)',
  battery: 'Battery voltage (V)',
  level: 'On/off channel (sorted out on reading)',
  toothTimes: 'Tooth edge times (s)',
  toothPeriod: 'Tooth periods (one row a tooth)',
  ignore: 'Not used',
};

export function MappingDialog({ summary, onApply }: { summary: ImportSummary; onApply: (roles: ChannelRole[], sampleRateHz?: number) => void }) {
  const [roles, setRoles] = useState<ChannelRole[]>(summary.channels.map((c) => c.role));
  const [rate, setRate] = useState('');
  return (
    <div role="dialog" aria-modal="true" aria-labelledby="mapping-title" className="rounded-2xl border-2 border-brand bg-surface p-5">
      <h2 id="mapping-title" className="text-xl font-bold">
        Which column is which?
      </h2>
      <p className="mb-3 text-muted">Crankprint is not sure of the channels in this file. Check each column against the first rows.</p>
      <div className="overflow-x-auto">
        <table className="figures w-full text-sm">
          <thead>
            <tr>
              {summary.header.map((h, i) => (
                <th key={i} className="p-1 text-left align-bottom">
                  <div className="font-sans font-bold">{h}</div>
                  <label className="sr-only" htmlFor={`role-${i}`}>
                    Role of column {i + 1}
                  </label>
                  <Select id={`role-${i}`} value={roles[i]} onChange={(e) => setRoles(roles.map((r, k) => (k === i ? (e.target.value as ChannelRole) : r)))}>
                    {Object.entries(ROLE_LABEL).map(([v, l]) => (
                      <option key={v} value={v}>
                        {l}
                      </option>
                    ))}
                  </Select>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {summary.preview.slice(0, 8).map((row, r) => (
              <tr key={r} className="border-t border-line">
                {row.map((cell, c) => (
                  <td key={c} className="p-1">
                    {cell}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="mt-3 max-w-xs">
        <Field id="sample-rate" label="Sample rate, if the first column counts samples" hint="Samples per second, for example 10000.">
          <Input id="sample-rate" inputMode="numeric" value={rate} onChange={(e) => setRate(e.target.value)} />
        </Field>
      </div>
      <Button onClick={() => onApply(roles, rate ? Number(rate) : undefined)}>Use this mapping</Button>
    </div>
  );
}
