import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * Integer codes for cluster values (office, caseworker, family…), so observations carry an `int`
 * and the engine an Int32Array. The value itself is stored only as a keyed hash, like identifiers.
 */
@Entity({ name: 'cluster_code' })
@Index('uq_cluster_code_program_hash', ['programId', 'valueHash'], { unique: true })
export class ClusterCode {
  /** The code stored in `observation.cluster_code`. */
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ type: 'int', unsigned: true })
  programId!: number;

  @Column({ type: 'binary', length: 32 })
  valueHash!: Buffer;
}
