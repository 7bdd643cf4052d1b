'use client';
/**
 * The workspace's analysis settings, kept in the URL (?s=…) so a reload or a hand-over keeps them; invalid or
 * absent → the defaults. A change applies at once (the URL follows through the history API), so a value
 * committed by leaving a field is the one a click on Save straight after sends. A URL changed from outside (a
 * link to a saved analysis, back and forward) is taken up, even while this page's own changes are on their way;
 * the URLs of those own changes are not, so quick changes never step back.
 */
import { usePathname, useSearchParams } from 'next/navigation';
import { useCallback, useMemo, useRef, useState } from 'react';
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
  const path = usePathname();
  const params = useSearchParams();
  const raw = params.get('s');
  const fromUrl = useMemo(() => settingsFromUrl(raw, initial), [raw, initial]);
  const [settings, setLocal] = useState(fromUrl);
  const [seen, setSeen] = useState(raw);
  /** What this page wrote to the URL, oldest first, until the URL shows it (quick writes may land only the last). */
  const pending = useRef<string[]>([]);
  if (raw !== seen) {
    setSeen(raw);
    const ours = raw === null ? -1 : pending.current.indexOf(raw);
    if (ours >= 0) pending.current = pending.current.slice(ours + 1);
    else {
      // A URL this page did not write (a link, back or forward) wins over writes still on their way.
      pending.current = [];
      setLocal(fromUrl);
    }
  }
  const setSettings = useCallback(
    (s: AnalysisSettingsValues) => {
      const text = JSON.stringify(s);
      pending.current = [...pending.current, text];
      setLocal(s);
      const next = new URLSearchParams(params);
      next.set('s', text);
      // The browser's own history API, which Next's router follows (useSearchParams sees it): the URL changes at
      // once and nothing is asked of the server, so a navigation that follows (a link to a saved analysis) can
      // never be overtaken by a settings change still on its way.
      window.history.replaceState(null, '', `${path}?${next}`);
    },
    [params, path],
  );
  return [settings, setSettings];
}
