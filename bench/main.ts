/** `npm run bench`: every benchmark, printed as Markdown tables. */
import { benchAnalysis } from './analysis';

const sections: (() => string[])[] = [benchAnalysis];

console.log(`# Tessera benchmarks (Node ${process.version}, ${new Date().toISOString()})\n`);
for (const section of sections) console.log(`${section().join('\n')}\n`);
