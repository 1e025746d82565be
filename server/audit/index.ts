export { recordAudit, type AuditEventInput } from './record';
