import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import { versionConflict } from '../core/errors';

/**
 * An update that only applies to the version the editor saw. TypeORM's save() does not check the
 * version column, so the check is in the WHERE clause and a miss answers 409.
 */
export async function updateVersioned<E extends ObjectLiteral>(
  m: EntityManager,
  target: EntityTarget<E>,
  id: string,
  expectedVersion: number,
  changes: Record<string, unknown>,
  what: string,
  idColumn = 'id',
): Promise<void> {
  const result = await m
    .createQueryBuilder()
    .update(target)
    .set({ ...changes, version: () => 'version + 1' } as never)
    .where(`${idColumn} = :id AND version = :v`, { id, v: expectedVersion })
    .execute();
  if (result.affected !== 1) throw versionConflict(what);
}
