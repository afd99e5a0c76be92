/** `npm run bench`: every benchmark, printed as Markdown tables. */
import { benchAnalysis } from './analysis';
import { benchEcp } from './ecp';
import { benchHamiltonian } from './hamiltonian';
import { benchIntegrals } from './integrals';
import { benchIrreps } from './irreps';
import { benchJobs } from './jobs';
import { benchLanguageServer } from './lsp';
import { benchPauli } from './pauli';
import { benchScf } from './scf';
import { benchSymmetry } from './symmetry';

type Section = () => string[] | Promise<string[]>;

const sections: Record<string, Section> = {
  analysis: benchAnalysis,
  symmetry: benchSymmetry,
  irreps: benchIrreps,
  pauli: benchPauli,
  hamiltonian: benchHamiltonian,
  integrals: benchIntegrals,
  ecp: benchEcp,
  scf: benchScf,
  lsp: () => benchLanguageServer(),
  jobs: benchJobs,
};

/** `TESSERA_BENCH=integrals,scf` runs only those sections (for profiling one of them). */
const only = process.env.TESSERA_BENCH?.split(',').map((name) => name.trim());

async function main(): Promise<void> {
  console.log(`# Tessera benchmarks (Node ${process.version}, ${new Date().toISOString()})\n`);
  for (const [name, section] of Object.entries(sections)) {
    if (!only || only.includes(name)) console.log(`${(await section()).join('\n')}\n`);
  }
}

void main();
