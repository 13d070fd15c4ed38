import { useMemo, useRef } from 'react';
import type { ReachProfile } from '@shared/kinematics/types';
import { ArmModelParams, profileOf } from './modelCore';
import { useDebouncedValue } from './useDebouncedValue';

/** Pause after the last keystroke before the profile is recomputed, ms. */
export const PROFILE_DEBOUNCE_MS = 150;

export interface LiveProfile {
  /** The last parameters that parsed (null until the first). */
  params: ArmModelParams | null;
  profile: ReachProfile | null;
  /** The current input does not parse (or its profile failed): what is shown is the last valid one. */
  stale: boolean;
  /** Why the profile could not be computed from valid parameters, if it could not. */
  failure: string | null;
}

/**
 * The side reach profile of what the form holds, recomputed by the shared core in the browser
 * about 150 ms after the last change; invalid input keeps the last valid profile, marked stale.
 */
export function useLiveProfile(values: unknown): LiveProfile {
  const key = useDebouncedValue(JSON.stringify(values ?? null), PROFILE_DEBOUNCE_MS);
  const last = useRef<{ params: ArmModelParams; profile: ReachProfile } | null>(null);
  return useMemo((): LiveProfile => {
    const parsed = ArmModelParams.safeParse(JSON.parse(key));
    if (!parsed.success) {
      return { params: last.current?.params ?? null, profile: last.current?.profile ?? null, stale: last.current !== null, failure: null };
    }
    try {
      const profile = profileOf(parsed.data);
      last.current = { params: parsed.data, profile };
      return { params: parsed.data, profile, stale: false, failure: null };
    } catch (error) {
      return {
        params: last.current?.params ?? null,
        profile: last.current?.profile ?? null,
        stale: true,
        failure: error instanceof Error ? error.message : 'The profile could not be computed.',
      };
    }
  }, [key]);
}
