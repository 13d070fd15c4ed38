export * from './types';
export * from './floor';
export * from './analyze';
export { findingId, sortFindings } from './messages';
