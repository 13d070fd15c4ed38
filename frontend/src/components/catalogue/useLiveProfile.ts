import { useMemo, useState } from 'react';
import type { ReachProfile } from '@shared/kinematics';
import type { EnvelopeProfile } from '@shared/kinematics';
import { readableMessage, ReadableError } from '@shared/schemas/errors';
import { ArmModelParams, envelopeOf, profileOf } from './modelCore';
import { useDebouncedValue } from './useDebouncedValue';

/** Pause after the last keystroke before the profile is recomputed, ms. */
export const PROFILE_DEBOUNCE_MS = 150;

export interface LiveProfile {
  /** The last parameters that parsed (null until the first). */
  params: ArmModelParams | null;
  profile: ReachProfile | null;
  /** The whole-arm envelope of the same parameters (null until the first). */
  envelope: EnvelopeProfile | null;
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
  const computed = useMemo(() => computeProfile(key), [key]);
  // The last profile that could be computed, kept for when the input stops parsing or computing.
  const [lastGood, setLastGood] = useState<GoodProfile | null>(null);
  if (computed.kind === 'good' && computed.good !== lastGood) setLastGood(computed.good);
  return useMemo((): LiveProfile => {
    if (computed.kind === 'good') return { ...computed.good, stale: false, failure: null };
    const shown = { params: lastGood?.params ?? null, profile: lastGood?.profile ?? null, envelope: lastGood?.envelope ?? null };
    if (computed.kind === 'invalid') return { ...shown, stale: lastGood !== null, failure: null };
    return { ...shown, stale: true, failure: computed.failure };
  }, [computed, lastGood]);
}

interface GoodProfile {
  params: ArmModelParams;
  profile: ReachProfile;
  envelope: EnvelopeProfile;
}

type Computed = { kind: 'good'; good: GoodProfile } | { kind: 'invalid' } | { kind: 'failed'; failure: string };

/** The profile of the form's values as JSON text: computed, not parsing, or failing with a reason. */
function computeProfile(json: string): Computed {
  const parsed = ArmModelParams.safeParse(JSON.parse(json));
  if (!parsed.success) return { kind: 'invalid' };
  try {
    return { kind: 'good', good: { params: parsed.data, profile: profileOf(parsed.data), envelope: envelopeOf(parsed.data) } };
  } catch (error) {
    if (!(error instanceof ReadableError)) console.error(error);
    return { kind: 'failed', failure: readableMessage(error, 'No reach could be worked out from these values: check the link lengths and the axis limits.') };
  }
}
