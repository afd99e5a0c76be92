/** Bundle entry of the language server (dist/server.js); the extension starts it over node IPC. */
import { startLanguageServer } from './start';

startLanguageServer();
