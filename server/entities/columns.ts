import type { EntitySchemaColumnOptions, EntitySchemaOptions } from 'typeorm';

type ForeignKeyOptions = NonNullable<EntitySchemaOptions<object>['foreignKeys']>[number];

// Entities are EntitySchemas (no decorators), so every column states its type explicitly.
export const idColumn: EntitySchemaColumnOptions = { type: 'varchar', length: 36, primary: true };
export const uuidColumn: EntitySchemaColumnOptions = { type: 'varchar', length: 36 };
export const nullableUuidColumn: EntitySchemaColumnOptions = { type: 'varchar', length: 36, nullable: true };
export const timestampColumn: EntitySchemaColumnOptions = { type: 'datetime' };
export const nullableTimestampColumn: EntitySchemaColumnOptions = { type: 'datetime', nullable: true };

/** A foreign key on a plain id column (we load related rows through repositories, not relations). */
export function foreignKey(
  target: string,
  column: string,
  onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT',
): ForeignKeyOptions {
  return { target, columnNames: [column], referencedColumnNames: ['id'], onDelete };
}
