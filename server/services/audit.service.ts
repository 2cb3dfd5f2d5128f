import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { Clock } from './principal';
import { repositoriesFor } from '../repositories/unit-of-work';

export interface AuditEntry {
  clubId: string | null;
  actorUserId: string | null;
  action: string;
  targetType?: string;
  targetId?: string;
  details?: Record<string, unknown>;
}

export class AuditService {
  constructor(private readonly clock: Clock) {}

  /** Pass the transaction's manager so the event commits or rolls back with the change it records. */
  async record(manager: EntityManager, entry: AuditEntry): Promise<void> {
    await repositoriesFor(manager).audit.insert({
      id: randomUUID(),
      clubId: entry.clubId,
      actorUserId: entry.actorUserId,
      action: entry.action,
      targetType: entry.targetType ?? null,
      targetId: entry.targetId ?? null,
      details: entry.details ?? null,
      createdAt: this.clock.now(),
    });
  }
}
