/** Messages between the bench's processes (Node IPC): the orchestrator, the server, the station processes. */

export interface BenchStation {
  code: string;
  email: string;
  userId: number;
}

/** Sizes in bytes of the Holdfire messages, copied by the raw ws reference. */
export interface MessageSizes {
  /** poll:opened as a station receives it (the count:event's JSON). */
  poll: number;
  /** A station's poll:answer command (the count:command payload's JSON). */
  answer: number;
  /** poll:answered as the conductor receives it. */
  relay: number;
}

export interface ServerTimings {
  /** process.cpuUsage() user + system, microseconds. */
  cpuMicros: number;
  rssBytes: number;
  /** Summed since start: time inside CountService.command (queue, catch-up, decide, durable append). */
  commandMs: number;
  commands: number;
  /** Summed: time an append waited for its group commit. */
  appendMs: number;
  appends: number;
  commits: number;
  /** Summed: time inside the count room's broadcast emit (encoding and writing to every socket). */
  broadcastMs: number;
  broadcasts: number;
  /** Summed: Count.update calls (the count list's status, written after every batch of events) and their time. */
  statusUpdateMs: number;
  statusUpdates: number;
}

export type ToServer =
  | { type: 'setup'; stations: number }
  | { type: 'crew'; procedureId: number; stations: number }
  | { type: 'timings' }
  | { type: 'stop' };

export type FromServer =
  | { type: 'listening'; url: string; wsUrl: string }
  | { type: 'setup'; teamId: number; stations: BenchStation[]; password: string }
  | { type: 'crew'; crewPlanId: number }
  | { type: 'timings'; timings: ServerTimings }
  | { type: 'stopped' }
  | { type: 'error'; message: string };

export type ToStations =
  | { type: 'holdfire'; url: string; countId: number; stations: { code: string; cookie: string }[] }
  | { type: 'ws'; wsUrl: string; clients: number; firstIndex: number }
  | { type: 'stats' }
  | { type: 'close' };

export interface StationStats {
  /** count:event seqs received twice (or going backwards) on one socket. */
  duplicated: number;
  /** count:event seqs skipped on one socket. */
  lost: number;
  /** poll:answer commands refused or unanswered. */
  refused: number;
  answered: number;
  wsReplies: number;
}

export type FromStations =
  | { type: 'ready'; what: 'holdfire' | 'ws' }
  | { type: 'stats'; stats: StationStats }
  | { type: 'closed' }
  | { type: 'error'; message: string };

export const STATION_PASSWORD = 'bench-station-password';
