export {
  AUDIT_ACTION_GROUP_LABEL,
  AUDIT_ACTION_WORDS,
  AUDIT_ACTIONS,
  AUDIT_KIND_LABEL,
  REMOVED,
  auditActionGroups,
  auditActionPhrase,
  auditKindLabel,
  auditKindOptions,
  auditRefs,
  describeAuditEvent,
  humanWords,
  layoutChangeLine,
} from './words';
export type { AuditAction, AuditEntity, AuditEventInput, AuditEventWords, AuditLookup, AuditOption, AuditRefKind, LayoutChange, LayoutList, PhraseCtx } from './words';
