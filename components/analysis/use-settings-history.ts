'use client';
/**
 * Undo and redo for the workspace's settings: every change made through `change` can be taken back (Ctrl+Z) and
 * made again (Ctrl+Shift+Z or Ctrl+Y), across any number of steps, until the page is left.
 */
import { useCallback, useRef, useState } from 'react';
import type { AnalysisSettingsValues } from '@/domain/analysis-settings';
import { sameSettings } from './settings-differences';

/** Steps kept either way. */
const DEPTH = 50;

export interface SettingsHistory {
  change: (next: AnalysisSettingsValues) => void;
  undo: () => void;
  redo: () => void;
  canUndo: boolean;
  canRedo: boolean;
}

export function useSettingsHistory(settings: AnalysisSettingsValues, apply: (s: AnalysisSettingsValues) => void): SettingsHistory {
  const past = useRef<AnalysisSettingsValues[]>([]);
  const future = useRef<AnalysisSettingsValues[]>([]);
  // The stacks live in refs (a change and its undo can come in one render); this counter re-renders the buttons.
  const [, setSteps] = useState(0);
  const current = useRef(settings);
  current.current = settings;
  const move = useCallback(
    (from: { current: AnalysisSettingsValues[] }, to: { current: AnalysisSettingsValues[] }) => {
      const target = from.current.pop();
      if (!target) return;
      to.current = [...to.current.slice(-(DEPTH - 1)), current.current];
      apply(target);
      setSteps((k) => k + 1);
    },
    [apply],
  );
  const change = useCallback(
    (next: AnalysisSettingsValues) => {
      if (sameSettings(next, current.current)) return;
      past.current = [...past.current.slice(-(DEPTH - 1)), current.current];
      future.current = [];
      apply(next);
      setSteps((k) => k + 1);
    },
    [apply],
  );
  return {
    change,
    undo: useCallback(() => move(past, future), [move]),
    redo: useCallback(() => move(future, past), [move]),
    canUndo: past.current.length > 0,
    canRedo: future.current.length > 0,
  };
}
