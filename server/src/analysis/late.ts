/**
 * Results that arrive after the analysis — mean-field energies and orbitals from worker-thread
 * jobs, for example — kept by the inputs that determine them (a key built from the fragment's
 * atoms, basis, charge and spin; see inputKey.ts), not by document version: a new version whose
 * fragment is unchanged finds its result again, and an edit that changes the inputs asks for a
 * new one.
 *
 * The jobs layer writes here (pending with progress, ready, failed); figures read here; whoever
 * shows figures subscribes to `onDidChange` and refreshes them (the language server re-sends
 * diagnostics, inlay hints and code lenses). Nothing here waits: a figure that needs a result not
 * yet there shows its planning estimate and says that a computed value is pending.
 */

export type LateResult<T> =
  | { readonly state: 'absent' }
  | { readonly state: 'pending'; readonly progress: number | null; readonly detail?: string }
  | { readonly state: 'ready'; readonly value: T }
  | { readonly state: 'failed'; readonly message: string; readonly data?: Readonly<Record<string, unknown>> };

export interface LateResultChange {
  /** What kind of result (for example `mean-field`). */
  readonly kind: string;
  readonly key: string;
  /**
   * The state after the change. Listeners that only care about arrivals skip `pending` changes:
   * a running job reports progress many times a second.
   */
  readonly state: LateResult<unknown>['state'];
}

export type Disposable = { dispose(): void };

const ABSENT: LateResult<never> = { state: 'absent' };

export class LateResults {
  private readonly results = new Map<string, LateResult<unknown>>();
  private readonly listeners = new Set<(change: LateResultChange) => void>();

  get<T>(kind: string, key: string): LateResult<T> {
    return (this.results.get(`${kind}\u0000${key}`) as LateResult<T> | undefined) ?? ABSENT;
  }

  /**
   * A job for these inputs is queued, started or reported progress (0–1, or null when unknown),
   * with a short description of where it is (`SCF iteration 7, E = −76.0268 Ha`).
   */
  pending(kind: string, key: string, progress: number | null = null, detail?: string): void {
    this.set(kind, key, detail === undefined ? { state: 'pending', progress } : { state: 'pending', progress, detail });
  }

  ready<T>(kind: string, key: string, value: T): void {
    this.set(kind, key, { state: 'ready', value });
  }

  /** The job could not give a result; `data` carries details for whoever words it (the atoms it is about, say). */
  failed(kind: string, key: string, message: string, data?: Readonly<Record<string, unknown>>): void {
    this.set(kind, key, data === undefined ? { state: 'failed', message } : { state: 'failed', message, data });
  }

  /** Forgets a result (its job was cancelled because nothing asks for these inputs any more). */
  forget(kind: string, key: string): void {
    if (this.results.delete(`${kind}\u0000${key}`)) this.emit({ kind, key, state: 'absent' });
  }

  onDidChange(listener: (change: LateResultChange) => void): Disposable {
    this.listeners.add(listener);
    return { dispose: () => this.listeners.delete(listener) };
  }

  private set(kind: string, key: string, result: LateResult<unknown>): void {
    this.results.set(`${kind}\u0000${key}`, result);
    this.emit({ kind, key, state: result.state });
  }

  private emit(change: LateResultChange): void {
    for (const listener of [...this.listeners]) listener(change);
  }
}
