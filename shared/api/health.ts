/** `GET /api/health` */
export interface HealthDto {
  status: 'ok' | 'degraded';
  version: string;
  database: { reachable: boolean; migrationsPending: number };
}
