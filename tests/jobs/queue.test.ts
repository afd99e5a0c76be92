/**
 * The job queue with its real worker thread (dist/worker.js, built by `npm test`): results in the
 * store against psi4 1.3.2 (tests/fixtures/scf-reference.psi4.json), prerequisites, demand,
 * cancellation through the shared flag and through termination, memory refusals and failures.
 *
 * Cancellation is checked by what happens (the job stops at its flag, the store forgets it, the
 * worker runs the next job correctly), never by a timed assertion: the grace period before
 * termination is made long so that only the flag can have stopped the job.
 */
import { readdirSync, readFileSync, readlinkSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { LateResults, MEAN_FIELD_KIND, requestKey, type MeanFieldOutcome, type Mp2Summary } from '../../server/src/analysis';
import { JobQueue, type JobEvent } from '../../server/src/jobs';
import { BOHR_IN_ANGSTROM } from '../../server/src/chemistry/units';
import { JOB_THREAD_NICE } from '../../server/src/jobs/priority';
import { ECP_CASES, mp2For, referenceCase, requestFor, slowRequest } from './requests';

const queues: JobQueue[] = [];

function makeQueue(options: ConstructorParameters<typeof JobQueue>[1] = {}): { queue: JobQueue; store: LateResults; events: JobEvent[] } {
  const store = new LateResults();
  const queue = new JobQueue(store, options);
  const events: JobEvent[] = [];
  queue.onEvent((event) => events.push(event));
  queues.push(queue);
  return { queue, store, events };
}

/** Nice value per thread id of this process (Linux: field 19 of /proc/self/task/<id>/stat). */
function threadNiceValues(): Map<number, number> {
  const values = new Map<number, number>();
  for (const id of readdirSync('/proc/self/task')) {
    try {
      const fields = readFileSync(`/proc/self/task/${id}/stat`, 'utf8').split(') ')[1]!.split(' ');
      values.set(Number(id), Number(fields[16]));
    } catch {
      // The thread ended between the listing and the read.
    }
  }
  return values;
}

function nextEvent(queue: JobQueue, test: (event: JobEvent) => boolean): Promise<JobEvent> {
  return new Promise((resolve) => {
    const subscription = queue.onEvent((event) => {
      if (test(event)) {
        subscription.dispose();
        resolve(event);
      }
    });
  });
}

afterEach(async () => {
  await Promise.all(queues.splice(0).map((queue) => queue.dispose()));
});

describe('the job queue', () => {
  it('computes a mean field in its worker and keeps it in the store under the request key (psi4 1.3.2 fixture)', async () => {
    const { queue, store } = makeQueue();
    const c = referenceCase('water', 'cc-pvdz', 'rhf');
    const request = requestFor(c);
    queue.setDemand('doc', [{ request, label: 'system' }]);
    expect(store.get(MEAN_FIELD_KIND, requestKey(request)).state).toBe('pending');
    const settled = await queue.whenSettled(request);
    expect(settled.state).toBe('ready');
    const outcome = (settled as { value: MeanFieldOutcome }).value;
    // psi4 1.3.2, scf_type pk (tests/fixtures/scf-reference.psi4.json).
    expect(Math.abs(outcome.result.energy - c.energy)).toBeLessThan(1e-6);
    expect(outcome.result.converged).toBe(true);
    expect(outcome.orbitals.alpha).toBeInstanceOf(Float64Array);
    expect(outcome.orbitals.alpha.length).toBe(c.nbf * outcome.result.orbitalCount);
  });

  it('runs MP2 after the mean field it needs, with that result as input (psi4 1.3.2 fixture)', async () => {
    const { queue, store, events } = makeQueue();
    const c = referenceCase('water', 'sto-3g', 'rhf');
    const meanField = requestFor(c);
    const mp2 = mp2For(meanField);
    // Only MP2 is asked for: the mean field is queued for it.
    queue.setDemand('doc', [{ request: mp2, label: 'system' }]);
    const settled = await queue.whenSettled(mp2);
    expect(settled.state).toBe('ready');
    const summary = (settled as { value: Mp2Summary }).value;
    // psi4 1.3.2 mp2_type conv, all electrons (fixture value `mp2`).
    expect(Math.abs(summary.correlationEnergy - c.mp2!)).toBeLessThan(1e-6);
    const occupations = summary.naturalOccupations!;
    // The natural occupations sum to the electron count, 10 (by construction).
    expect(occupations.reduce((a, b) => a + b, 0)).toBeCloseTo(10, 9);
    expect(store.get(MEAN_FIELD_KIND, requestKey(meanField)).state).toBe('ready');
    expect(events.filter((e) => e.type === 'started').map((e) => e.job.kind)).toEqual(['mean-field', 'mp2']);
  });

  it('gives UHF MP2 its energy only and applies frozen core (psi4 1.3.2 fixture)', async () => {
    const { queue } = makeQueue();
    const uhf = referenceCase('water cation', '6-31g*', 'uhf');
    const water = referenceCase('water', 'cc-pvdz', 'rhf');
    const uhfMp2 = mp2For(requestFor(uhf));
    const frozen = mp2For(requestFor(water), true);
    queue.setDemand('doc', [
      { request: uhfMp2, label: 'cation' },
      { request: frozen, label: 'water' },
    ]);
    const [a, b] = await Promise.all([queue.whenSettled(uhfMp2), queue.whenSettled(frozen)]);
    const uhfSummary = (a as { value: Mp2Summary }).value;
    expect(Math.abs(uhfSummary.correlationEnergy - uhf.mp2!)).toBeLessThan(1e-6);
    expect(uhfSummary.naturalOccupations).toBeNull();
    const frozenSummary = (b as { value: Mp2Summary }).value;
    // Fixture value `mp2FrozenCore`: psi4 freezes the O 1s, as Tessera's noble-gas rule does.
    expect(Math.abs(frozenSummary.correlationEnergy - water.mp2FrozenCore!)).toBeLessThan(1e-6);
    expect(frozenSummary.frozenOrbitals).toBe(1);
  });

  it('computes a request once for two owners, and keeps its result while either wants it', async () => {
    const { queue, events } = makeQueue();
    const request = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    queue.setDemand('a', [{ request, label: 'system' }]);
    queue.setDemand('b', [{ request, label: 'system' }]);
    await queue.whenSettled(request);
    queue.setDemand('a', []);
    queue.setDemand('b', [{ request, label: 'system' }]);
    expect(queue.resultOf(request).state).toBe('ready');
    expect(events.filter((e) => e.type === 'started')).toHaveLength(1);
  });

  it('cancels a running job whose inputs changed at its flag, mid-integral, and runs the new one in the same worker', async () => {
    // A long grace period: only the flag can stop the job.
    const { queue, store, events } = makeQueue({ cancelGraceMs: 60_000 });
    const slow = slowRequest();
    queue.setDemand('doc', [{ request: slow, label: 'benzene' }]);
    // The first J/K build (computing the integrals) follows the guess.
    await nextEvent(queue, (event) => event.type === 'progress' && event.progress.phase === 'guess');
    const next = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    const cancelled = nextEvent(queue, (event) => event.type === 'cancelled');
    queue.setDemand('doc', [{ request: next, label: 'water' }]);
    // The old result is forgotten at once; nothing waits for the worker.
    expect(store.get(MEAN_FIELD_KIND, requestKey(slow)).state).toBe('absent');
    const event = (await cancelled) as Extract<JobEvent, { type: 'cancelled' }>;
    expect(event.job.key).toBe(requestKey(slow));
    expect(event.how).toBe('flag');
    expect(['guess', 'scf']).toContain(event.phase);
    const settled = await queue.whenSettled(next);
    // psi4 1.3.2 fixture.
    expect(Math.abs((settled as { value: MeanFieldOutcome }).value.result.energy - referenceCase('water', 'sto-3g', 'rhf').energy)).toBeLessThan(1e-6);
    expect(events.some((e) => e.type === 'done' && e.job.key === requestKey(slow))).toBe(false);
  });

  it('terminates a worker that does not stop in time and carries on with a new one', async () => {
    const { queue, events } = makeQueue({ cancelGraceMs: 0 });
    const slow = slowRequest();
    queue.setDemand('doc', [{ request: slow, label: 'benzene' }]);
    await nextEvent(queue, (event) => event.type === 'progress' && event.progress.phase === 'guess');
    const cancelled = nextEvent(queue, (event) => event.type === 'cancelled');
    queue.release('doc');
    const event = (await cancelled) as Extract<JobEvent, { type: 'cancelled' }>;
    expect(event.how).toBe('terminated');
    const next = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    queue.setDemand('doc', [{ request: next, label: 'water' }]);
    expect((await queue.whenSettled(next)).state).toBe('ready');
    expect(events.filter((e) => e.type === 'failed')).toEqual([]);
  });

  it('cancels a queued job before it starts when nothing asks for it any more', async () => {
    const { queue, events } = makeQueue({ startDelayMs: 10_000 });
    const request = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    queue.setDemand('doc', [{ request, label: 'water' }]);
    queue.setDemand('doc', []);
    expect(events.map((e) => [e.type, (e as { how?: string }).how])).toEqual([['cancelled', 'unstarted']]);
    expect(queue.resultOf(request).state).toBe('absent');
  });

  it('reports progress: SCF iterations with energies and their change', async () => {
    const { queue, events } = makeQueue();
    const request = requestFor(referenceCase('water', 'cc-pvdz', 'rhf'));
    queue.setDemand('doc', [{ request, label: 'water' }]);
    await queue.whenSettled(request);
    const scf = events.filter((e): e is Extract<JobEvent, { type: 'progress' }> => e.type === 'progress' && e.progress.phase === 'scf');
    expect(scf.length).toBeGreaterThan(0);
    expect(scf[0]!.text).toMatch(/^SCF iteration \d+ · E = −\d+\.\d{6} Ha/);
  });

  it('refuses a request beyond the memory limit with its estimated cost', async () => {
    const { queue, events } = makeQueue({ memoryLimitBytes: 50 * 2 ** 20 });
    const request = slowRequest();
    queue.setDemand('doc', [{ request, label: 'fragment ring' }]);
    const settled = await queue.whenSettled(request);
    expect(settled.state).toBe('failed');
    const message = (settled as { message: string }).message;
    expect(message).toContain('fragment ring (114 basis functions)');
    expect(message).toMatch(/an estimate from 114 functions/);
    expect(message).toContain('memory limit of 50 MiB');
    expect(events.filter((e) => e.type === 'started')).toEqual([]);
    // Raising the limit asks again.
    queue.configure({ memoryLimitBytes: 2 * 2 ** 30 });
    expect(queue.resultOf(request).state).toBe('pending');
  });

  it('says which atoms sit on top of each other, and computes nothing for them', async () => {
    const { queue } = makeQueue();
    const request = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    const atoms = request.inputs.atoms.map((atom, k) => (k === 2 ? { ...request.inputs.atoms[1]!, x: request.inputs.atoms[1]!.x + 0.01 } : atom));
    const stacked = { ...request, inputs: { ...request.inputs, atoms } };
    queue.setDemand('doc', [{ request: stacked, label: 'water' }]);
    const settled = (await queue.whenSettled(stacked)) as { state: string; message: string; data: { code: string; atoms: number[] } };
    expect(settled.state).toBe('failed');
    expect(settled.message).toContain('Atoms 2 (H) and 3 (H) of the part are 0.010 Å apart');
    expect(settled.data).toEqual({ code: 'input', atoms: [1, 2] });
  });

  it('keeps a result that did not converge as such, and MP2 after it fails with the reason', async () => {
    const { queue } = makeQueue();
    const request = requestFor(referenceCase('water', 'cc-pvdz', 'rhf'), { maxIterations: 2 });
    const mp2 = mp2For(request);
    queue.setDemand('doc', [
      { request, label: 'water' },
      { request: mp2, label: 'water' },
    ]);
    const settled = (await queue.whenSettled(request)) as { value: MeanFieldOutcome };
    expect(settled.value.result.converged).toBe(false);
    expect(settled.value.result.iterations).toBe(2);
    const after = (await queue.whenSettled(mp2)) as { state: string; message: string };
    expect(after.state).toBe('failed');
    expect(after.message).toContain('MP2 needs a converged mean field; it stopped after 2 iterations');
  });

  it('refuses an element without basis data, naming the element and the atom', async () => {
    const { queue } = makeQueue();
    const request = {
      ...requestFor(referenceCase('water', 'sto-3g', 'rhf')),
      // 6-31G stops at Kr in psi4-data's library file (tests/fixtures/basis-counts.nwchem.json agrees).
      inputs: { atoms: [{ symbol: 'H', x: 0, y: 0, z: 0 }, { symbol: 'Rb', x: 0, y: 0, z: 3 }], basis: ['6-31G', '6-31G'], functions: 'cartesian' as const, charge: 0, multiplicity: 1 },
      functions: 2,
    };
    queue.setDemand('doc', [{ request, label: 'pair' }]);
    const settled = (await queue.whenSettled(request)) as { state: string; message: string; data: { code: string; atoms: number[] } };
    expect(settled.state).toBe('failed');
    expect(settled.message).toContain("Basis set '6-31G' has no functions for Rb (atom 2)");
    expect(settled.data).toEqual({ code: 'basis', atoms: [1] });
  });

  it('computes a part whose basis carries an effective core potential (psi4 1.3.2 ECP fixture)', async () => {
    const { queue } = makeQueue();
    const hydrogenIodide = ECP_CASES.find((c) => c.name === 'hydrogen iodide' && c.basis === 'def2-svp' && c.kind === 'spherical')!;
    const request = {
      ...requestFor(referenceCase('water', 'sto-3g', 'rhf')),
      inputs: {
        atoms: hydrogenIodide.geometry.map((atom) => ({ symbol: atom.symbol, x: atom.x * BOHR_IN_ANGSTROM, y: atom.y * BOHR_IN_ANGSTROM, z: atom.z * BOHR_IN_ANGSTROM })),
        basis: hydrogenIodide.geometry.map(() => 'def2-SVP'),
        functions: 'spherical' as const,
        charge: 0,
        multiplicity: 1,
      },
      functions: hydrogenIodide.references.rhf!.nbf,
    };
    queue.setDemand('doc', [{ request, label: 'hydrogen iodide' }]);
    const settled = (await queue.whenSettled(request)) as { value: MeanFieldOutcome };
    // psi4 1.3.2, scf_type pk (tests/fixtures/ecp-energies.psi4.json).
    expect(Math.abs(settled.value.result.energy - hydrogenIodide.references.rhf!.energy)).toBeLessThan(1e-6);
  });

  it.runIf(process.platform === 'linux')('runs its worker thread at a lowered priority, leaving the calling thread as it was', async () => {
    const own = Number(readlinkSync('/proc/thread-self').split('/').pop());
    const before = threadNiceValues();
    const { queue } = makeQueue();
    const request = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    queue.setDemand('doc', [{ request, label: 'system' }]);
    expect((await queue.whenSettled(request)).state).toBe('ready');
    const after = threadNiceValues();
    expect(after.get(own)).toBe(before.get(own));
    const lowered = [...after].filter(([id, nice]) => !before.has(id) && nice === JOB_THREAD_NICE);
    expect(lowered.length).toBe(1);
  });

  it('forgets the oldest finished results nobody wants beyond the ones it keeps', async () => {
    const { queue } = makeQueue({ keepResults: 1 });
    const first = requestFor(referenceCase('water', 'sto-3g', 'rhf'));
    const second = requestFor(referenceCase('neon atom', 'cc-pvdz', 'rhf'));
    const third = requestFor(referenceCase('hydrogen fluoride', 'def2-svp', 'rhf'));
    for (const request of [first, second, third]) {
      queue.setDemand('doc', [{ request, label: 'part' }]);
      await queue.whenSettled(request);
    }
    queue.setDemand('doc', []);
    // The last one wanted is kept (by construction: keepResults 1).
    expect([first, second, third].map((request) => queue.resultOf(request).state)).toEqual(['absent', 'absent', 'ready']);
  });
});
