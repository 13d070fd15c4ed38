/** The checksum of snapshots and of their parts (no database here, so the diff and its tests can use it alone). */
import { createHash } from 'node:crypto';
import { canonicalJson } from '@shared/canonicalJson';

/** sha256 (hex) of the canonical JSON of a snapshot (keys sorted at every level). */
export function snapshotChecksum(snapshot: unknown): string {
  return createHash('sha256').update(canonicalJson(snapshot)).digest('hex');
}
