'use client';
/**
 * A number setting typed as a draft: what is typed stays in the field and changes nothing until it is applied
 * (on Enter or on leaving the field), and only when the settings with it pass the settings schema. An invalid
 * draft shows its reason beside the field; every other setting is left as it was.
 */
import { type KeyboardEvent, useState } from 'react';
import { Field, Input } from '@/components/ui/field';
import { type AnalysisSettingsValues, analysisSettingsSchema } from '@/domain/analysis-settings';

type NumberSetting = 'lowLimitPercent' | 'highLimitPercent' | 'spreadLimitPercent';

export function DraftNumberField({ id, label, field, settings, onChange }: { id: string; label: string; field: NumberSetting; settings: AnalysisSettingsValues; onChange: (s: AnalysisSettingsValues) => void }) {
  const [draft, setDraft] = useState<string | null>(null);
  const text = draft ?? String(settings[field]);
  const problem = draft === null ? undefined : problemOf(draft, field, settings);
  const apply = () => {
    if (draft === null || problem) return;
    const value = Number(draft.trim().replace(',', '.'));
    setDraft(null);
    if (value !== settings[field]) onChange({ ...settings, [field]: value });
  };
  return (
    <Field id={id} label={label} error={problem}>
      <Input
        id={id}
        inputMode="decimal"
        className="figures"
        value={text}
        invalid={!!problem}
        onChange={(ev) => setDraft(ev.target.value)}
        onBlur={apply}
        onKeyDown={draftKeys(apply, () => setDraft(null))}
      />
    </Field>
  );
}

/** A draft field's keys: Enter applies what is typed (and submits nothing), Escape drops it. */
export function draftKeys(apply: () => void, drop: () => void) {
  return (ev: KeyboardEvent<HTMLInputElement>) => {
    if (ev.key === 'Enter') {
      ev.preventDefault();
      apply();
    } else if (ev.key === 'Escape') drop();
  };
}

/** Why the draft cannot be applied, in the schema's words, or undefined when it can. */
function problemOf(draft: string, field: NumberSetting, settings: AnalysisSettingsValues): string | undefined {
  const t = draft.trim().replace(',', '.');
  if (!/^\d+(\.\d+)?$/.test(t)) return 'Enter a number, for example 90.';
  const parsed = analysisSettingsSchema.safeParse({ ...settings, [field]: Number(t) });
  if (parsed.success) return undefined;
  return (parsed.error.issues.find((i) => i.path[0] === field) ?? parsed.error.issues[0]).message;
}
