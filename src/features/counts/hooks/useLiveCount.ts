import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { CountCommandInput, CountEventDto } from '../../../contract/count';
import { estimateOffset, type ClockSyncSample } from '../../../domain/count/clockSync';
import type { CountEvent } from '../../../domain/count/events';
import { reduce } from '../../../domain/count/reduce';
import { initialCountState, tAt, type CountState } from '../../../domain/count/state';
import { sessionKeys } from '../../../lib/session';
import { closeSocket, getSocket } from '../../../lib/socket';

/** The count time a log line shows: when it happened, except a start, which shows the T the count started at. */
export function logT(before: CountState, after: CountState, e: CountEvent): number {
  return e.type === 'count:started' ? tAt(after, e.at) : tAt(before, e.at);
}

export type Connection = 'connecting' | 'connected' | 'reconnecting' | 'offline';

/** One log line: the event and the count time it happened at. */
export interface LogEntry {
  event: CountEvent;
  t: number;
}

/** `queued`: no connection now; the command waits and goes out (with its commandId) once the count is joined again. */
export type CommandResult = { ok: true; queued?: boolean } | { ok: false; error: string; details?: { path: string; message: string }[] };

export interface QueuedCommand {
  commandId: string;
  command: CountCommandInput;
  /** True once it has gone out on the current connection (it is then waiting for its answer). */
  sent: boolean;
}

const SYNC_BURST = 4;
const SYNC_EVERY_MS = 30_000;

function newCommandId(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  return `c-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;
}

function isOnline(): boolean {
  return typeof navigator === 'undefined' || navigator.onLine !== false;
}

/**
 * The live count over the socket: joins the count, folds its events with the same reducer the server uses
 * (deduplicated by seq, re-joining from the last seq after a drop or a gap), keeps the server clock offset,
 * and sends commands, each with a commandId: while offline they wait in a queue and go out once the count
 * is joined again, with the same commandId, so a retry never acts twice.
 */
export function useLiveCount(countId: number, initial: CountState | undefined) {
  const socket = useMemo(() => getSocket(), []);
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  const stateRef = useRef<CountState | null>(initial ?? null);
  const logRef = useRef<LogEntry[]>([]);
  /** False until the first join has folded the whole history (the log needs every event). */
  const historyRef = useRef(false);
  const joinedRef = useRef(false);
  const joiningRef = useRef(false);
  const bufferRef = useRef<CountEvent[]>([]);
  const pendingRef = useRef(new Map<string, { command: CountCommandInput; sent: boolean; resolve: (r: CommandResult) => void }>());
  const samplesRef = useRef<ClockSyncSample[]>([]);

  const [state, setState] = useState<CountState | null>(initial ?? null);
  const [log, setLog] = useState<LogEntry[]>([]);
  const [connection, setConnection] = useState<Connection>(socket.connected ? 'connected' : isOnline() ? 'connecting' : 'offline');
  const [offset, setOffset] = useState(0);
  const [queued, setQueued] = useState<QueuedCommand[]>([]);
  const [joinError, setJoinError] = useState<string | null>(null);
  /** A refusal of a command that was queued: nobody is waiting on it any more, so it is shown on its own. */
  const [lateRefusal, setLateRefusal] = useState<string | null>(null);

  const lateHandler = useCallback(
    (command: CountCommandInput) => (r: CommandResult) => {
      if (!r.ok) setLateRefusal(`A command sent after the connection came back was refused (${command.type}): ${r.error}`);
    },
    [],
  );

  // A later REST answer may be newer than what the socket gave so far; it never replaces a fuller state.
  useEffect(() => {
    if (initial && (stateRef.current === null || initial.lastSeq > stateRef.current.lastSeq)) {
      stateRef.current = initial;
      setState(initial);
    }
  }, [initial]);

  const publishQueue = useCallback(() => {
    setQueued([...pendingRef.current].map(([commandId, p]) => ({ commandId, command: p.command, sent: p.sent })));
  }, []);

  const join = useRef<() => void>(() => {});

  /** Fold events in seq order; a gap (a missed seq) means re-joining from the last seq we have. */
  const fold = useCallback((incoming: readonly CountEvent[]) => {
    let s = stateRef.current ?? initialCountState();
    const sorted = [...incoming].sort((a, b) => a.seq - b.seq);
    const added: LogEntry[] = [];
    for (const e of sorted) {
      if (e.seq <= s.lastSeq) continue;
      if (e.seq !== s.lastSeq + 1) {
        bufferRef.current.push(e);
        joinedRef.current = false;
        join.current();
        break;
      }
      const before = s;
      s = reduce(s, e);
      added.push({ event: e, t: logT(before, s, e) });
    }
    if (added.length === 0) return;
    stateRef.current = s;
    logRef.current = [...logRef.current, ...added];
    setState(s);
    setLog(logRef.current);
  }, []);

  const emitCommand = useCallback(
    (commandId: string) => {
      const p = pendingRef.current.get(commandId);
      if (!p) return;
      p.sent = true;
      socket.emit('count:command', { countId, command: p.command }, (reply) => {
        const still = pendingRef.current.get(commandId);
        if (!still) return; // a retry already answered
        pendingRef.current.delete(commandId);
        publishQueue();
        if ('data' in reply) {
          fold(reply.data.events);
          still.resolve({ ok: true });
        } else {
          still.resolve({ ok: false, error: reply.error, details: reply.details });
        }
      });
    },
    [countId, fold, publishQueue, socket],
  );

  join.current = () => {
    if (joiningRef.current || !socket.connected) return;
    joiningRef.current = true;
    const fromScratch = !historyRef.current;
    const sinceSeq = fromScratch ? 0 : (stateRef.current?.lastSeq ?? 0);
    socket.emit('count:join', { countId, sinceSeq }, (reply) => {
      joiningRef.current = false;
      if (!('data' in reply)) {
        setJoinError(reply.error);
        return;
      }
      setJoinError(null);
      if (fromScratch) {
        // Fold the whole history from the start so every event has its log line and its count time.
        stateRef.current = initialCountState();
        logRef.current = [];
        historyRef.current = true;
      }
      joinedRef.current = true;
      const buffered = bufferRef.current;
      bufferRef.current = [];
      fold([...reply.data.events, ...buffered] as CountEvent[]);
      if (reply.data.state && stateRef.current && stateRef.current.lastSeq < reply.data.state.lastSeq) {
        // The server's state is ahead of the events it sent: trust it (the log misses the difference).
        stateRef.current = reply.data.state;
        setState(reply.data.state);
      }
      // Whatever waited for the connection goes out now, in the order it was asked, with its own commandId.
      for (const id of [...pendingRef.current.keys()]) emitCommand(id);
      publishQueue();
    });
  };

  const syncClock = useCallback(
    (times: number) => {
      if (times <= 0 || !socket.connected) return;
      const clientSentAt = Date.now();
      socket.emit('clock:sync', { clientSentAt }, (reply) => {
        if (!('data' in reply)) return;
        samplesRef.current = [...samplesRef.current.slice(-15), { clientSentAt, serverAt: reply.data.serverAt, clientReceivedAt: Date.now() }];
        const est = estimateOffset(samplesRef.current);
        if (est) setOffset(est.offset);
        syncClock(times - 1);
      });
    },
    [socket],
  );

  useEffect(() => {
    const onConnect = () => {
      setConnection('connected');
      joinedRef.current = false;
      join.current();
      syncClock(SYNC_BURST);
    };
    const onDrop = () => {
      joinedRef.current = false;
      joiningRef.current = false;
      for (const p of pendingRef.current.values()) {
        p.sent = false;
        // Whoever waited on it hears "queued" now; a refusal after the reconnect shows on its own.
        p.resolve({ ok: true, queued: true });
        p.resolve = lateHandler(p.command);
      }
      publishQueue();
      setConnection(isOnline() ? 'reconnecting' : 'offline');
    };
    const onEvents = (list: CountEventDto[]) => {
      const mine = list.filter((e) => e.countId === countId);
      if (mine.length === 0) return;
      if (joinedRef.current) fold(mine);
      else bufferRef.current.push(...mine);
    };
    const onEnded = ({ reason }: { reason: string }) => {
      closeSocket();
      navigate('/sign-in', { replace: true, state: { notice: reason } });
      queryClient.setQueryData(sessionKeys.me(), null);
    };
    const onOffline = () => setConnection('offline');
    const onOnline = () => setConnection(socket.connected ? 'connected' : 'reconnecting');

    socket.on('connect', onConnect);
    socket.on('disconnect', onDrop);
    socket.on('connect_error', onDrop);
    socket.on('count:events', onEvents);
    socket.on('session:ended', onEnded);
    window.addEventListener('offline', onOffline);
    window.addEventListener('online', onOnline);
    if (socket.connected) onConnect();
    else socket.connect();
    const timer = setInterval(() => syncClock(1), SYNC_EVERY_MS);

    return () => {
      clearInterval(timer);
      socket.off('connect', onConnect);
      socket.off('disconnect', onDrop);
      socket.off('connect_error', onDrop);
      socket.off('count:events', onEvents);
      socket.off('session:ended', onEnded);
      window.removeEventListener('offline', onOffline);
      window.removeEventListener('online', onOnline);
      if (socket.connected) socket.emit('count:leave', { countId });
      joinedRef.current = false;
      joiningRef.current = false;
    };
  }, [countId, fold, lateHandler, navigate, publishQueue, queryClient, socket, syncClock]);

  const send = useCallback(
    (command: CountCommandInput): Promise<CommandResult> => {
      const commandId = command.commandId ?? newCommandId();
      const full = { ...command, commandId };
      return new Promise<CommandResult>((resolve) => {
        const live = joinedRef.current && socket.connected;
        pendingRef.current.set(commandId, { command: full, sent: false, resolve: live ? resolve : lateHandler(full) });
        if (live) emitCommand(commandId);
        else resolve({ ok: true, queued: true });
        publishQueue();
      });
    },
    [emitCommand, lateHandler, publishQueue, socket],
  );

  return { state, log, connection, offset, queued, send, joinError, lateRefusal, dismissLateRefusal: () => setLateRefusal(null) };
}

export type LiveCount = ReturnType<typeof useLiveCount>;
