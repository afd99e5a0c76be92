/** `npm run bench`: every benchmark, printed as Markdown tables. */
import { benchAnalysis } from './analysis';
import { benchHamiltonian } from './hamiltonian';
import { benchIrreps } from './irreps';
import { benchLanguageServer } from './lsp';
import { benchPauli } from './pauli';
import { benchSymmetry } from './symmetry';

type Section = () => string[] | Promise<string[]>;

const sections: Section[] = [benchAnalysis, benchSymmetry, benchIrreps, benchPauli, benchHamiltonian, () => benchLanguageServer()];

async function main(): Promise<void> {
  console.log(`# Tessera benchmarks (Node ${process.version}, ${new Date().toISOString()})\n`);
  for (const section of sections) console.log(`${(await section()).join('\n')}\n`);
}

void main();
