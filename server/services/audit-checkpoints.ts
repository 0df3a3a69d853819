/**
 * Checkpoints of the audit trail, kept outside SQLite in an append-only text file (by default
 * DATA_DIR/audit-checkpoints.log): one JSON line per committed transaction that added events to a
 * lab's chain, written right after the commit (one line per transaction and lab, not one per event):
 *
 *   {"lab":"…","events":57,"head":"<hash of the 57th event>","at":1764921600000,
 *    "time":"2026-12-05T08:00:00.000Z","prev":"<mac of the line before>","mac":"<HMAC-SHA-256>"}
 *
 * `mac` is the HMAC (audit key) over the canonical JSON of the other fields, and `prev` links each
 * line to the one before, so a line cannot be forged, edited or taken out of the middle without the
 * key. The file is what shows a cut at the end of the database's chain; copies kept off the machine
 * also show a cut of the file itself. Lines are appended with one write each and no fsync: after a
 * crash the file may lag the database by the last transaction, never lead it.
 */
import { createHmac } from 'node:crypto';
import fs from 'node:fs';
import { canonicalJson } from './audit';

export interface Checkpoint {
  lab: string | null;
  /** Events in the lab's chain after the transaction. */
  events: number;
  /** The hash of the last of them. */
  head: string;
  at: number;
  time: string;
  prev: string;
  mac: string;
}

export interface CheckpointReading {
  /** Every line that parsed, with its line number (1-based). */
  lines: (Checkpoint & { line: number })[];
  /** The first line that is not a whole, sealed checkpoint linked to the one before. */
  problem: { line: number; detail: string } | null;
  /** False when the file does not exist. */
  exists: boolean;
}

const isCheckpoint = (v: unknown): v is Checkpoint => {
  const c = v as Checkpoint;
  return (
    !!c && (c.lab === null || typeof c.lab === 'string') && Number.isInteger(c.events) && typeof c.head === 'string' &&
    typeof c.at === 'number' && typeof c.prev === 'string' && typeof c.mac === 'string'
  );
};

export class CheckpointLog {
  private lastMac = '';
  private readonly latestByLab = new Map<string | null, Checkpoint>();

  constructor(
    readonly file: string,
    private readonly key: Buffer,
    private readonly warn: (message: string, err?: unknown) => void = () => undefined,
  ) {
    for (const c of this.read().lines) {
      this.lastMac = c.mac;
      this.latestByLab.set(c.lab, c);
    }
  }

  private mac(body: Omit<Checkpoint, 'mac'>): string {
    return createHmac('sha256', this.key).update(canonicalJson(body)).digest('hex');
  }

  /** Appends a checkpoint of a lab's chain. A failed write is reported, not thrown: the event is already committed. */
  append(lab: string | null, events: number, head: string, at = Date.now()): Checkpoint {
    const body = { lab, events, head, at, time: new Date(at).toISOString(), prev: this.lastMac };
    const checkpoint: Checkpoint = { ...body, mac: this.mac(body) };
    try {
      fs.appendFileSync(this.file, `${JSON.stringify(checkpoint)}\n`, { mode: 0o640 });
      this.lastMac = checkpoint.mac;
      this.latestByLab.set(lab, checkpoint);
    } catch (err) {
      this.warn(`The audit checkpoint of ${events} events could not be written to ${this.file}`, err);
    }
    return checkpoint;
  }

  /** The last checkpoint this process wrote or read for a lab. */
  latest(lab: string | null): Checkpoint | null {
    return this.latestByLab.get(lab) ?? null;
  }

  /** Reads the whole file from disk and checks every line's seal and link. */
  read(): CheckpointReading {
    let text: string;
    try {
      text = fs.readFileSync(this.file, 'utf8');
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { lines: [], problem: null, exists: false };
      return { lines: [], problem: { line: 0, detail: `the checkpoint file ${this.file} cannot be read (${(err as NodeJS.ErrnoException).code})` }, exists: true };
    }
    const lines: CheckpointReading['lines'] = [];
    let problem: CheckpointReading['problem'] = null;
    let prev = '';
    const rows = text.split('\n');
    if (rows.at(-1) === '') rows.pop();
    rows.forEach((raw, i) => {
      const line = i + 1;
      let parsed: unknown;
      try {
        parsed = JSON.parse(raw);
      } catch {
        problem ??= { line, detail: `line ${line} of the checkpoint file is not a whole checkpoint` };
        return;
      }
      if (!isCheckpoint(parsed)) {
        problem ??= { line, detail: `line ${line} of the checkpoint file is not a checkpoint` };
        return;
      }
      const { mac, ...body } = parsed;
      if (this.mac(body) !== mac) problem ??= { line, detail: `line ${line} of the checkpoint file does not carry a valid seal under the audit key (changed, or written with another key)` };
      else if (body.prev !== prev) problem ??= { line, detail: `line ${line} of the checkpoint file does not follow the line before it (a line was removed or moved)` };
      prev = mac;
      lines.push({ ...parsed, line });
    });
    return { lines, problem, exists: true };
  }
}
