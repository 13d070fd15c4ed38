// Finding ids are `kind:id+id…`; parseFindingId is the one reader of them.
import { describe, expect, it } from 'vitest';
import { findingId, parseFindingId } from '@shared/analysis';

describe('finding ids', () => {
  it('round-trip through findingId and parseFindingId', () => {
    expect(parseFindingId(findingId('shared-zone', 'R1', 'R2'))).toEqual({ kind: 'shared-zone', ids: ['R1', 'R2'] });
    expect(parseFindingId(findingId('reach-into-structure', 'R4', 'COLUMNS'))).toEqual({ kind: 'reach-into-structure', ids: ['R4', 'COLUMNS'] });
    expect(parseFindingId('unreached-point:P7')).toEqual({ kind: 'unreached-point', ids: ['P7'] });
  });
  it('refuse text that is not a finding id', () => {
    expect(parseFindingId('')).toBeNull();
    expect(parseFindingId('shared-zone')).toBeNull();
    expect(parseFindingId(':R1+R2')).toBeNull();
    expect(parseFindingId('no-such-kind:R1')).toBeNull();
    expect(parseFindingId('toString:R1')).toBeNull();
  });
});
