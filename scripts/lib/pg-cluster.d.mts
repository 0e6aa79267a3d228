// Types for pg-cluster.mjs (plain JavaScript so it runs before npm packages are installed).
export interface Cluster {
  url: string;
  port: number;
  bin: string;
  password: string;
  stop: () => void;
  /** pg_ctl -m fast stop (the data stays). */
  pause: () => void;
  /** Starts the stopped cluster again on the same port. */
  resume: () => void;
}
export function freePort(): Promise<number>;
export function startCluster(opts: {
  home: string;
  port: number;
  database?: string;
  fast?: boolean;
  throwaway?: boolean;
}): Promise<Cluster>;
export function startThrowawayCluster(): Promise<Cluster>;
