/** Bundle entry of the `tessera` command. */
import { main } from './main';

main();
