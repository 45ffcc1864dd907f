export interface HealthStatus {
  status: 'ok' | 'degraded';
  db: 'up' | 'down';
}
