export * from './types';
export * from './floor';
export * from './analyze';
export { findingId, parseFindingId, sortFindings } from './messages';
export { isReached, roundMargin } from './reached';
