import type { EntityManager } from 'typeorm';
import { AuditEventEntity, type AuditEvent } from '../entities/audit-event.entity';

export class AuditRepository {
  constructor(private readonly manager: EntityManager) {}

  async insert(event: AuditEvent): Promise<void> {
    await this.manager.insert(AuditEventEntity, event);
  }

  latest(action: string): Promise<AuditEvent | null> {
    return this.manager.findOne(AuditEventEntity, { where: { action }, order: { createdAt: 'DESC' } });
  }

  listByAction(action: string): Promise<AuditEvent[]> {
    return this.manager.find(AuditEventEntity, { where: { action }, order: { createdAt: 'ASC' } });
  }
}
