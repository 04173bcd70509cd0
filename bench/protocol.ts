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

/** The server process's memory after garbage collection. */
export interface ServerMemory {
  rssBytes: number;
  heapUsedBytes: number;
  externalBytes: number;
  /** False if gc() was not available (then the figures include garbage). */
  collected: boolean;
}

export type ToServer =
  | { type: 'setup'; stations: number }
  /** A crew plan of `stations` bench stations after the first `from` (default 0). */
  | { type: 'crew'; procedureId: number; stations: number; from?: number }
  | { type: 'timings' }
  | { type: 'memory' }
  | { type: 'stop' };

export type FromServer =
  | { type: 'listening'; url: string; wsUrl: string; sioUrl: string }
  | { type: 'setup'; teamId: number; stations: BenchStation[]; password: string }
  | { type: 'crew'; crewPlanId: number }
  | { type: 'timings'; timings: ServerTimings }
  | { type: 'memory'; memory: ServerMemory }
  | { type: 'stopped' }
  | { type: 'error'; message: string };

export type ToStations =
  /** Station sockets that join `countId` (or their own `countId`) and answer GO to every poll that asks them. */
  | { type: 'holdfire'; url: string; countId: number; stations: { code: string; cookie: string; countId?: number }[] }
  /**
   * Every station socket of this process drops its connection at once, then all reconnect at once and rejoin
   * from their last seq (`count:join { countId, sinceSeq }`, as the client does). Answered with 'dropped' when the
   * sockets are closed, and 'rejoined' when every station's join is answered.
   */
  | { type: 'storm' }
  /** Per-station figures of the last storm: when each station had every event up to `targetSeq`. */
  | { type: 'storm-report'; targetSeq: number }
  | { type: 'ws'; wsUrl: string; clients: number; firstIndex: number }
  | { type: 'sio'; sioUrl: string; clients: number; firstIndex: number }
  | { type: 'stats' }
  | { type: 'close' };

export interface StationStats {
  /** count:event seqs received twice (or going backwards) on one socket. */
  duplicated: number;
  /** count:event seqs skipped on one socket (after a rejoin: in the catch-up followed by what arrived). */
  lost: number;
  /** poll:answer commands refused or unanswered. */
  refused: number;
  answered: number;
  wsReplies: number;
  /** Polls of the socket.io reference answered, and their acknowledgements received. */
  sioReplies: number;
  sioAcks: number;
}

export interface StormReport {
  /** Per station: ms from its drop until it had applied every event up to the target seq (null: never). */
  caughtUpMs: (number | null)[];
  /** Per station: ms from its drop until its count:join was answered. */
  rejoinMs: number[];
  /** Per station: the events its rejoin's catch-up carried. */
  catchUpEvents: number[];
  /** Per station: the size of its join's answer (JSON: the catch-up and the count's state), bytes. */
  replyBytes: number[];
  /** Per station: the last seq it has applied (all must equal the log's last). */
  lastSeqs: number[];
  /** Broadcasts of events the rejoin's catch-up also carried (before or after its answer): dropped, as the client does. */
  overlap: number;
  /** Stations whose events did not chain (an event's prevHash is not the hash of the one before). */
  chainBreaks: number;
}

export type FromStations =
  | { type: 'ready'; what: 'holdfire' | 'ws' | 'sio' }
  | { type: 'stats'; stats: StationStats }
  | { type: 'dropped'; at: number }
  /** `failed`: why the stations that could not reconnect or rejoin did not. */
  | { type: 'rejoined'; failed: string[] }
  | { type: 'storm-report'; report: StormReport }
  | { type: 'closed' }
  | { type: 'error'; message: string };

export const STATION_PASSWORD = 'bench-station-password';
