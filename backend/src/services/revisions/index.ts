/**
 * Revisions: immutable snapshots of a layout (content, its analysis, the floor plan and the arm
 * models' parameters) with a sha256 checksum of the canonical JSON, the review decision, and the
 * sheet input built from the snapshot (never from the live layout).
 */
export type { RevisionDiff, RevisionSnapshot } from '@shared/schemas/revision';
export { diffSnapshots } from './diff';
export { presentComment, presentRevisionDetail, presentRevisions, REVISION_LIST_ATTRIBUTES } from './present';
export { loadRevisionSheetInput } from './sheetInput';
export { buildSnapshot, fullSnapshot, loadSnapshotFloorPlan, readSnapshot, snapshotChecksum, splitSnapshot } from './snapshot';
export { decideRevision, freezeRevision, loadVisibleRevision, recordDecision, revisionLetter, submitRevision, type RevisionDecision } from './workflow';
