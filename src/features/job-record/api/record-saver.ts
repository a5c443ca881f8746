import type { QueryClient } from '@tanstack/react-query';
import type { JobDetail } from '../../../../shared/schemas/jobs.ts';
import { parseSectionChanges, type JobSectionKey } from '../../../../shared/schemas/job-record.ts';
import { ApiError, NetworkError } from '../../../lib/api-client.ts';
import { normaliseSection } from './get-job.ts';
import { jobRecordKeys } from './job-record-keys.ts';
import { writeSection } from './write-section.ts';

/** Where one field of the record stands after the person changed it. */
export type FieldState =
  | { status: 'saving'; value: unknown }
  | { status: 'saved' }
  /** Refused: the first message, and every issue the server named (paths within the section). */
  | { status: 'error'; value: unknown; message: string; issues?: ReadonlyArray<{ path: string; message: string }> }
  /** Someone else changed this field since the version we had: theirs is now stored. */
  | { status: 'conflict'; mine: unknown; theirs: unknown };

export type SaveOutcome = 'saved' | 'refused' | 'conflict' | 'read-only';

const fieldKey = (section: JobSectionKey, field: string) => `${section}.${field}`;

/** The section as it stands in a 409's details: `{ data, version }`, or wrapped as `{ section: … }`. */
function sectionFromDetails(details: unknown): { data: unknown; version: number } | null {
  const candidate = details && typeof details === 'object' && 'section' in details ? (details as { section: unknown }).section : details;
  if (candidate && typeof candidate === 'object' && 'version' in candidate && 'data' in candidate && typeof candidate.version === 'number') {
    return { data: candidate.data, version: candidate.version };
  }
  return null;
}

/**
 * Saves the job record field by field (no React): each change is checked with the section's zod
 * schema first, then sent with the section's version as last seen. Writes of one section go one
 * at a time, each reading the version the previous one left, so a person never conflicts with
 * themself; different sections go side by side. The answer updates the cached job in place.
 */
export class RecordSaver {
  private readonly states = new Map<string, FieldState>();
  private readonly queues = new Map<JobSectionKey, Promise<unknown>>();
  private readonly listeners = new Set<() => void>();
  private lockedMessage: string | null = null;

  constructor(
    private readonly queryClient: QueryClient,
    readonly jobId: number,
  ) {}

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  /** Grows with every change of any field's state: a snapshot for views that show many fields. */
  revision = 0;

  private notify() {
    this.revision += 1;
    for (const listener of this.listeners) listener();
  }

  state(section: JobSectionKey, field: string): FieldState | undefined {
    return this.states.get(fieldKey(section, field));
  }

  /** The server refused a write because the job is approved or issued: its message. */
  get locked(): string | null {
    return this.lockedMessage;
  }

  private setState(section: JobSectionKey, field: string, state: FieldState | undefined) {
    if (state) this.states.set(fieldKey(section, field), state);
    else this.states.delete(fieldKey(section, field));
    this.notify();
  }

  private detail(): JobDetail | undefined {
    return this.queryClient.getQueryData<JobDetail>(jobRecordKeys.detail(this.jobId));
  }

  /**
   * The newest state of each section this saver has heard from the server. A refetch of the job
   * that started before a write landed can bring back an older section; `withLatest` puts the
   * newer one back, and writes never send a version older than this.
   */
  private readonly latest = new Map<JobSectionKey, { data: unknown; version: number }>();

  /** The job with every section at least as new as the answers this saver has had. */
  withLatest = (detail: JobDetail): JobDetail => {
    let record = detail.record;
    for (const [section, state] of this.latest) {
      if (state.version > record[section].version) record = { ...record, [section]: normaliseSection(section, state) };
    }
    return record === detail.record ? detail : { ...detail, record };
  };

  private putSection(section: JobSectionKey, state: { data: unknown; version: number }, extra: Partial<Pick<JobDetail, 'findings' | 'cursor'>> = {}) {
    if (state.version >= (this.latest.get(section)?.version ?? -1)) this.latest.set(section, state);
    this.queryClient.setQueryData<JobDetail>(jobRecordKeys.detail(this.jobId), (detail) => {
      if (!detail) return detail;
      // A version never goes back: an older answer arriving late leaves the newer section alone.
      const current = detail.record[section];
      const record = state.version >= current.version ? { ...detail.record, [section]: normaliseSection(section, state) } : detail.record;
      return { ...detail, ...extra, record };
    });
  }

  /**
   * Saves one field. Resolves when the server has answered (or the change was refused here):
   * 'saved', 'refused' (its message is at the field), 'conflict' or 'read-only'.
   */
  save(section: JobSectionKey, field: string, value: unknown): Promise<SaveOutcome> {
    const checked = parseSectionChanges(section, { [field]: value });
    if (!checked.success) {
      this.setState(section, field, { status: 'error', value, message: checked.error.issues[0]?.message ?? 'That value cannot be saved.' });
      return Promise.resolve('refused');
    }
    if (this.lockedMessage) return Promise.resolve('read-only');
    this.setState(section, field, { status: 'saving', value });
    const previous = this.queues.get(section) ?? Promise.resolve();
    const run = previous.then(() => this.send(section, field, value));
    this.queues.set(section, run.catch(() => undefined));
    return run;
  }

  private async send(section: JobSectionKey, field: string, value: unknown): Promise<SaveOutcome> {
    const version = Math.max(this.detail()?.record[section].version ?? 0, this.latest.get(section)?.version ?? 0);
    try {
      const answer = await writeSection(this.jobId, section, { version, changes: { [field]: value } });
      this.putSection(section, answer.section, { findings: answer.findings, cursor: answer.cursor });
      this.stored.set(fieldKey(section, field), value);
      // Only a newer change of the same field may replace this state.
      const now = this.state(section, field);
      if (now?.status === 'saving' && Object.is(now.value, value)) this.setState(section, field, { status: 'saved' });
      // Lists and other panels show this job too; the detail itself is already current.
      void this.queryClient.invalidateQueries({
        queryKey: jobRecordKeys.all,
        predicate: (query) => !(query.queryKey[1] === 'detail' && query.queryKey[2] === this.jobId),
      });
      return 'saved';
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) {
        const current = sectionFromDetails(error.details);
        if (current) this.putSection(section, current);
        const theirs = current ? (current.data as Record<string, unknown> | null)?.[field] : undefined;
        this.setState(section, field, { status: 'conflict', mine: value, theirs: theirs ?? null });
        if (!current) void this.queryClient.invalidateQueries({ queryKey: jobRecordKeys.detail(this.jobId) });
        return 'conflict';
      }
      if (error instanceof ApiError && error.status === 423) {
        this.lockedMessage = error.message;
        this.setState(section, field, { status: 'error', value, message: error.message });
        void this.queryClient.invalidateQueries({ queryKey: jobRecordKeys.all });
        return 'read-only';
      }
      const message =
        error instanceof ApiError
          ? (error.issues[0]?.message ?? error.message)
          : error instanceof NetworkError
            ? 'Not saved: the server cannot be reached. Change the field again, or press Try again, once you are back online.'
            : 'Not saved: something went wrong.';
      this.setState(section, field, { status: 'error', value, message, issues: error instanceof ApiError ? error.issues : undefined });
      return 'refused';
    }
  }

  /** After a conflict: send mine again over theirs (the section's version is now current). */
  keepMine(section: JobSectionKey, field: string): Promise<SaveOutcome> {
    const state = this.state(section, field);
    if (state?.status !== 'conflict') return Promise.resolve('saved');
    return this.save(section, field, state.mine);
  }

  /** After a conflict: leave theirs, drop mine. */
  takeTheirs(section: JobSectionKey, field: string) {
    this.setState(section, field, undefined);
  }

  /** The last value this saver stored for each field: a value seen on the server that is one of ours is no one else's change. */
  private readonly stored = new Map<string, unknown>();

  /** Whether `value` is what this saver last stored for the field (so not someone else's change). */
  isOwnValue(section: JobSectionKey, field: string, value: unknown): boolean {
    const key = fieldKey(section, field);
    return this.stored.has(key) && JSON.stringify(this.stored.get(key)) === JSON.stringify(value);
  }

  /**
   * The field changed on the server (another person, shown by the job's polling) while this person
   * was typing over the value they started from: nothing is sent, and the field offers keep mine /
   * take theirs as after a 409. Without this, the draft would go with the newer version the poll
   * brought and silently replace theirs.
   */
  conflictWhileTyping(section: JobSectionKey, field: string, mine: unknown, theirs: unknown) {
    this.setState(section, field, { status: 'conflict', mine, theirs });
  }

  /** Forget a field's state (e.g. an error the person fixed by putting the old value back). */
  clear(section: JobSectionKey, field: string) {
    this.setState(section, field, undefined);
  }
}
