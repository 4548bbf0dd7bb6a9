import { CreateDateColumn, UpdateDateColumn } from 'typeorm';

/**
 * Timestamp columns with millisecond precision. The default must carry the same precision as the
 * column, or TypeORM sees a difference between entities and migrations on every comparison.
 */
export const CreatedAtColumn = () => CreateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' });
export const UpdatedAtColumn = () =>
  UpdateDateColumn({ type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' });
