import { EntitySchema } from 'typeorm';
import { foreignKey, idColumn, nullableUuidColumn, timestampColumn } from './columns';

export interface AuditEvent {
  id: string;
  clubId: string | null;
  actorUserId: string | null;
  /** e.g. "auth.sign_in", "clip.upload", "athlete.consent", "invitation.create". */
  action: string;
  targetType: string | null;
  targetId: string | null;
  details: object | null;
  createdAt: Date;
}

export const AuditEventEntity = new EntitySchema<AuditEvent>({
  name: 'AuditEvent',
  tableName: 'audit_event',
  columns: {
    id: idColumn,
    clubId: nullableUuidColumn,
    actorUserId: nullableUuidColumn,
    action: { type: 'varchar', length: 60 },
    targetType: { type: 'varchar', length: 40, nullable: true },
    targetId: { type: 'varchar', length: 36, nullable: true },
    details: { type: 'simple-json', nullable: true },
    createdAt: timestampColumn,
  },
  foreignKeys: [foreignKey('Club', 'clubId', 'CASCADE'), foreignKey('User', 'actorUserId', 'SET NULL')],
  indices: [{ name: 'IDX_audit_event_club_time', columns: ['clubId', 'createdAt'] }],
});
