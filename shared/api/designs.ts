import type { DesignSettings } from '../schemas/design';

/** One version of a design's settings. Versions count from 1 and never change once written. */
export interface DesignVersionDto {
  id: number;
  designId: number;
  version: number;
  settings: DesignSettings;
  createdAt: string;
  createdBy: string;
  /** The reason given for the change (required once the design is locked). */
  reason: string | null;
}

/**
 * A recorded departure from the pre-registered (locked) plan: a version written after the lock.
 * Shown beside every result computed with `toVersion` or later, and listed in the annex.
 */
export interface DeviationDto {
  id: number;
  designId: number;
  fromVersion: number;
  toVersion: number;
  reason: string;
  /** Settings that differ between the two versions, e.g. `['kernel', 'donutRadius']`. */
  changed: Array<keyof DesignSettings>;
  recordedAt: string;
  recordedBy: string;
}

/** The lock: the version that was pre-registered, and when. */
export interface DesignLockDto {
  lockedAt: string;
  lockedBy: string;
  lockedVersion: number;
  note: string | null;
  /** Cohorts whose extract was already accepted at the lock (their outcomes were seen). */
  periodsSeenBeforeLock: string[];
}

/** `GET /api/programs/:programId/designs` (rows) and `…/designs/:designId` (with versions and deviations). */
export interface DesignDto {
  id: number;
  programId: number;
  name: string;
  /** The design scheduled recomputes, dashboards and the e-mail use. One per program. */
  primary: boolean;
  currentVersion: DesignVersionDto;
  lock: DesignLockDto | null;
  deviationCount: number;
  createdAt: string;
  updatedAt: string;
}

export interface DesignDetailDto extends DesignDto {
  versions: DesignVersionDto[];
  deviations: DeviationDto[];
}

/** `GET /api/programs/:programId/designs/:designId/compare?from=&to=` */
export interface DesignComparisonDto {
  designId: number;
  from: DesignVersionDto;
  to: DesignVersionDto;
  changes: Array<{ setting: keyof DesignSettings; from: unknown; to: unknown }>;
}
