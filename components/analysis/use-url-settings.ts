'use client';
/** The workspace's analysis settings, kept in the URL (?s=…) so a reload or a hand-over keeps them; invalid or absent → the defaults. */
import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { useCallback, useMemo } from 'react';
import { type AnalysisSettingsValues, analysisSettingsSchema } from '@/domain/analysis-settings';

function settingsFromUrl(raw: string | null, fallback: AnalysisSettingsValues): AnalysisSettingsValues {
  if (!raw) return fallback;
  try {
    const parsed = analysisSettingsSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : fallback;
  } catch {
    return fallback;
  }
}

export function useUrlSettings(initial: AnalysisSettingsValues): [AnalysisSettingsValues, (s: AnalysisSettingsValues) => void] {
  const router = useRouter();
  const path = usePathname();
  const params = useSearchParams();
  const settings = useMemo(() => settingsFromUrl(params.get('s'), initial), [params, initial]);
  const setSettings = useCallback(
    (s: AnalysisSettingsValues) => {
      const next = new URLSearchParams(params);
      next.set('s', JSON.stringify(s));
      router.replace(`${path}?${next}`, { scroll: false });
    },
    [params, path, router],
  );
  return [settings, setSettings];
}
