/**
 * The language server: a thin adapter between the LSP connection and the language service.
 * Transport (stdio, node IPC, socket or pipe) comes from the command line (transport.ts, which also
 * holds back malformed input and requests the protocol forbids before `initialize` or after `shutdown`).
 */
import {
  CodeActionKind,
  LSPErrorCodes,
  DidChangeConfigurationNotification,
  DidChangeWatchedFilesNotification,
  ResponseError,
  TextDocuments,
  TextDocumentSyncKind,
  type Connection,
  type InitializeParams,
  type InitializeResult,
  type Message,
  type ResponseMessage,
} from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { MAPPINGS, type Mapping } from '../chemistry/qubits';
import * as service from '../services';
import { AnalysisHost, DEFAULT_BATH_THRESHOLD, type AnalysisSettings, type BathOrbitals } from '../analysis';
import { DEFAULT_COMPUTE_SETTINGS, readComputeSettings, ServerComputations, type ComputeEditorSettings } from './computations';
import { CoalescingScheduler, pathToUri, uriToPath } from './documents';
import { FailureReporter } from './guard';
import { ArrivedVersions } from './arrivals';
import { openServerConnection } from './transport';
import { warmUp } from './warmUp';

/** Semantic-token results kept per document for deltas. */
const TOKEN_HISTORY = 4;

/** A first guess at what analysing a document costs before it has been measured: 1 ms per 20,000 characters. */
const CHARACTERS_PER_MS = 20_000;

/**
 * A request the editor cancelled before the server got to it (it sends `$/cancelRequest` when the
 * document changes under a pending request) is answered as cancelled without running: stale work
 * for an older version never delays the latest one.
 */
const cancelUndispatched = (message: Message): ResponseMessage | undefined => {
  const id = (message as { id?: number | string }).id;
  return id === undefined ? undefined : { jsonrpc: '2.0', id, error: { code: LSPErrorCodes.RequestCancelled, message: 'The request was cancelled before it ran.' } };
};

export interface EditorSettings {
  defaultMapping: Mapping;
  qubitLimit: number | null;
  inlayHints: boolean;
  codeLens: boolean;
  compute: ComputeEditorSettings;
  /** The computed DMET bath: threshold on the singular values, and the fragment's orbitals. */
  bathThreshold: number;
  bathOrbitals: BathOrbitals;
}

const DEFAULT_SETTINGS: EditorSettings = { defaultMapping: 'jordan-wigner', qubitLimit: null, inlayHints: true, codeLens: true, compute: DEFAULT_COMPUTE_SETTINGS, bathThreshold: DEFAULT_BATH_THRESHOLD, bathOrbitals: 'lowdin' };

/** While jobs report progress, code lenses (which show it) are refreshed at most this often. */
const PROGRESS_LENS_INTERVAL_MS = 1000;

function readSettings(raw: unknown): EditorSettings {
  const section = (raw ?? {}) as Record<string, unknown>;
  const mapping = section['defaultMapping'];
  const limit = section['qubitLimit'];
  const inlay = (section['inlayHints'] as Record<string, unknown> | undefined)?.['enabled'];
  const lens = (section['codeLens'] as Record<string, unknown> | undefined)?.['enabled'];
  const embedding = (section['embedding'] ?? {}) as Record<string, unknown>;
  const threshold = embedding['bathThreshold'];
  const orbitals = embedding['bathOrbitals'];
  return {
    defaultMapping: typeof mapping === 'string' && (MAPPINGS as readonly string[]).includes(mapping) ? (mapping as Mapping) : DEFAULT_SETTINGS.defaultMapping,
    qubitLimit: typeof limit === 'number' && Number.isInteger(limit) && limit > 0 ? limit : null,
    inlayHints: typeof inlay === 'boolean' ? inlay : true,
    codeLens: typeof lens === 'boolean' ? lens : true,
    compute: readComputeSettings(section),
    // The same range the command line's --bath-threshold accepts.
    bathThreshold: typeof threshold === 'number' && threshold > 0 && threshold < 0.5 ? threshold : DEFAULT_BATH_THRESHOLD,
    bathOrbitals: orbitals === 'iao' || orbitals === 'lowdin' ? orbitals : 'lowdin',
  };
}

/** What the analyses take from the editor settings. */
function analysisSettingsOf(settings: EditorSettings): AnalysisSettings {
  return {
    defaultMapping: settings.defaultMapping,
    ...(settings.qubitLimit ? { defaultQubitLimit: settings.qubitLimit } : {}),
    bathThreshold: settings.bathThreshold,
    bathOrbitals: settings.bathOrbitals,
  };
}

/** A version superseded on the wire waits at most this many times for the newer one before it is published anyway. */
const MAX_PUBLISH_DEFERRALS = 20;
const PUBLISH_DEFERRAL_MS = 25;

export function startLanguageServer(given?: Connection): Connection {
  const arrived = new ArrivedVersions();
  const connection = given ?? openServerConnection(process.argv.slice(2), { cancelUndispatched }, (message) => arrived.observe(message));
  const documents = new TextDocuments(TextDocument);
  const cache = new AnalysisHost({ open: (uri) => documents.get(uri), pathOf: uriToPath, uriOf: pathToUri });
  const scheduler = new CoalescingScheduler();
  /**
   * The semantic tokens last sent per document, a few results deep: the editor asks for a delta
   * from the last result it received, which is not always the last one sent (it may have cancelled
   * that request), so a delta from any recent one saves sending the whole document again.
   */
  const sentTokens = new Map<string, { resultId: string; data: Int32Array }[]>();
  let tokenResults = 0;
  let canRefreshHints = false;
  let canRefreshLenses = false;
  /** Whether the client expands snippet syntax in completion items. */
  let canExpandSnippets = false;
  let settings = DEFAULT_SETTINGS;
  let canPullConfiguration = false;
  let canWatchFiles = false;
  const failures = new FailureReporter(connection);
  // Last resort: a failure outside any handler is logged, and the server keeps serving.
  process.on('uncaughtException', (error) => failures.report('the language server', undefined, undefined, error));
  process.on('unhandledRejection', (error) => failures.report('the language server', undefined, undefined, error));

  const analysisOf = (uri: string) => cache.get(uri);
  // Long computations (mean field, MP2) run in worker threads; their results arrive in cache.late.
  const computations = new ServerComputations(connection, cache, settings.compute, (what, error) => failures.report(what, undefined, undefined, error));

  /** Analyses the document's current version, whatever was scheduled, and sends its diagnostics. */
  const deferrals = new Map<string, number>();
  const publish = (uri: string) => {
    const document = documents.get(uri);
    if (!document) return;
    const version = document.version;
    // A newer version has arrived and waits its turn: rather than analyse this one, publish that
    // one (its change schedules it). A version analysed already is published all the same: it
    // costs nothing and covers the edits so far. The wait is bounded in case the change is never applied.
    const deferred = deferrals.get(uri) ?? 0;
    if (arrived.superseded(uri, version) && !cache.isCurrent(uri) && deferred < MAX_PUBLISH_DEFERRALS) {
      deferrals.set(uri, deferred + 1);
      setTimeout(() => schedulePublish(uri), PUBLISH_DEFERRAL_MS);
      return;
    }
    deferrals.delete(uri);
    let diagnostics;
    try {
      // Always the current version, whatever was scheduled.
      const analysis = cache.get(uri)!;
      diagnostics = service.doValidation(analysis, uri, pathToUri);
    } catch (error) {
      // One document's failure shows in its own Problems; the others are not affected.
      failures.report('checking', uri, version, error);
      diagnostics = [failures.diagnosticFor(error)];
    }
    void connection.sendDiagnostics({ uri, version, diagnostics });
    // What the version wants computed, after its diagnostics are on their way.
    const analysed = cache.isCurrent(uri) ? cache.get(uri) : undefined;
    if (analysed) setImmediate(() => computations.analysed(uri, analysed));
  };
  const documentOf = (params: unknown) => {
    const uri = (params as { textDocument?: { uri?: unknown }; uri?: unknown } | null)?.textDocument?.uri ?? (params as { uri?: unknown } | null)?.uri;
    const version = typeof uri === 'string' ? documents.get(uri)?.version : undefined;
    return typeof uri === 'string' ? { uri, ...(version !== undefined ? { version } : {}) } : {};
  };
  const schedulePublish = (uri: string) => scheduler.schedule(uri, () => publish(uri), (documents.get(uri)?.getText().length ?? 0) / CHARACTERS_PER_MS);

  // Results that arrive later change figures: diagnostics are sent again, editors that can are
  // asked to fetch hints and lenses again, and the views are told. Progress of a running job
  // (pending) only changes the lenses that show it, refreshed at most once a second.
  let lastLensRefresh = 0;
  let lensTimer: ReturnType<typeof setTimeout> | undefined;
  const refreshLenses = () => {
    lastLensRefresh = performance.now();
    if (canRefreshLenses) void connection.sendRequest('workspace/codeLens/refresh').catch(() => undefined);
  };
  cache.late.onDidChange((change) => {
    if (change.state === 'pending') {
      if (lensTimer) return;
      lensTimer = setTimeout(() => {
        lensTimer = undefined;
        refreshLenses();
      }, Math.max(0, PROGRESS_LENS_INTERVAL_MS - (performance.now() - lastLensRefresh)));
      return;
    }
    for (const document of documents.all()) schedulePublish(document.uri);
    if (canRefreshHints) void connection.languages.inlayHint.refresh().catch(() => undefined);
    refreshLenses();
    void connection.sendNotification('tessera/computedChanged', { kind: change.kind, state: change.state });
  });

  const applySettings = (next: EditorSettings) => {
    const unchanged = JSON.stringify(next) === JSON.stringify(settings);
    settings = next;
    // Settings are sent again on every change of any setting; unchanged ones keep the analyses.
    if (unchanged) return;
    computations.configure(next.compute);
    cache.configure(analysisSettingsOf(next));
    for (const document of documents.all()) schedulePublish(document.uri);
    void connection.sendNotification('tessera/settingsChanged');
  };

  const pullSettings = async () => {
    if (!canPullConfiguration) return;
    try {
      applySettings(readSettings(await connection.workspace.getConfiguration('tessera')));
    } catch (error) {
      connection.console.warn(`Could not read the tessera settings: ${(error as Error).message}`);
    }
  };

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    const capabilities = params.capabilities;
    canPullConfiguration = capabilities.workspace?.configuration === true;
    canWatchFiles = capabilities.workspace?.didChangeWatchedFiles?.dynamicRegistration === true;
    canRefreshHints = capabilities.workspace?.inlayHint?.refreshSupport === true;
    canRefreshLenses = capabilities.workspace?.codeLens?.refreshSupport === true;
    canExpandSnippets = capabilities.textDocument?.completion?.completionItem?.snippetSupport === true;
    const initial = (params.initializationOptions as { settings?: unknown } | undefined)?.settings;
    if (initial) settings = readSettings(initial);
    computations.configure(settings.compute);
    cache.configure(analysisSettingsOf(settings));
    return {
      capabilities: {
        textDocumentSync: { openClose: true, change: TextDocumentSyncKind.Incremental },
        hoverProvider: true,
        completionProvider: { triggerCharacters: [' ', '='], resolveProvider: false },
        definitionProvider: true,
        referencesProvider: true,
        documentHighlightProvider: true,
        renameProvider: { prepareProvider: true },
        documentSymbolProvider: true,
        workspaceSymbolProvider: true,
        semanticTokensProvider: { legend: service.semanticTokensLegend, full: { delta: true } },
        foldingRangeProvider: true,
        selectionRangeProvider: true,
        documentFormattingProvider: true,
        documentRangeFormattingProvider: true,
        codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix] },
        inlayHintProvider: true,
        codeLensProvider: { resolveProvider: false },
        executeCommandProvider: { commands: [service.COMPUTE_COMMAND, service.STOP_COMMAND] },
      },
      serverInfo: { name: 'tessera', version: typeof TESSERA_VERSION === 'string' ? TESSERA_VERSION : '0.0.0-dev' },
    };
  });

  connection.onInitialized(() => {
    if (canPullConfiguration) {
      void connection.client.register(DidChangeConfigurationNotification.type, { section: 'tessera' });
      void pullSettings();
    }
    if (canWatchFiles) {
      void connection.client.register(DidChangeWatchedFilesNotification.type, { watchers: [{ globPattern: '**/*.xyz' }] });
    }
  });

  connection.onDidChangeConfiguration((change) => {
    if (canPullConfiguration) void pullSettings();
    else applySettings(readSettings((change.settings as Record<string, unknown> | undefined)?.['tessera']));
  });

  connection.onDidChangeWatchedFiles((change) => {
    for (const event of change.changes) {
      const file = uriToPath(event.uri);
      if (!file) continue;
      for (const uri of cache.dependents(file)) {
        cache.invalidate(uri);
        schedulePublish(uri);
      }
    }
  });

  documents.onDidOpen((event) => schedulePublish(event.document.uri));
  documents.onDidChangeContent((event) => {
    const uri = event.document.uri;
    schedulePublish(uri);
    // An open XYZ file included by other specs: re-check them.
    const file = uriToPath(uri);
    if (file?.endsWith('.xyz')) {
      for (const dependent of cache.dependents(file)) {
        cache.invalidate(dependent);
        schedulePublish(dependent);
      }
    }
  });
  documents.onDidClose((event) => {
    scheduler.forget(event.document.uri);
    sentTokens.delete(event.document.uri);
    cache.remove(event.document.uri);
    computations.closed(event.document.uri);
    void connection.sendDiagnostics({ uri: event.document.uri, diagnostics: [] });
  });

  /**
   * `askedAgain`: a request the editor sends again after every change (tokens, hints, lenses,
   * symbols). For a version already superseded on the wire it answers ContentModified without
   * analysing that version, and the editor asks again for the new one.
   */
  const onDocument = <P extends { textDocument: { uri: string } }, R>(feature: string, handler: (analysis: NonNullable<ReturnType<typeof analysisOf>>, params: P) => R, empty: R, askedAgain = false) =>
    failures.guard(feature, documentOf, (params: P): R => {
      const uri = params.textDocument.uri;
      const version = documents.get(uri)?.version;
      if (askedAgain && version !== undefined && arrived.superseded(uri, version)) throw new ResponseError(LSPErrorCodes.ContentModified, 'The document has changed since; ask again for its new version.');
      const analysis = analysisOf(uri);
      return analysis ? handler(analysis, params) : empty;
    });

  connection.onHover(onDocument('hover', (analysis, params) => service.doHover(analysis, params.position, computations.policy(params.textDocument.uri)), null));
  connection.onCompletion(onDocument('completion', (analysis, params) => service.doComplete(analysis, params.position, { snippets: canExpandSnippets, ...(params.context?.triggerCharacter ? { triggerCharacter: params.context.triggerCharacter } : {}) }), { isIncomplete: false, items: [] }));
  connection.onDefinition(onDocument('go to definition', (analysis, params) => service.findDefinition(analysis, params.textDocument.uri, params.position), null));
  connection.onReferences(onDocument('find references', (analysis, params) => service.findReferences(analysis, params.textDocument.uri, params.position, params.context.includeDeclaration), []));
  connection.onDocumentHighlight(onDocument('highlight', (analysis, params) => service.findDocumentHighlights(analysis, params.position), []));
  connection.onPrepareRename(
    onDocument('rename', (analysis, params) => {
      const check = service.prepareRename(analysis, params.position);
      if (!check.ok) throw new ResponseError(0, check.message);
      return { range: check.range, placeholder: check.placeholder };
    }, null),
  );
  connection.onRenameRequest(
    onDocument('rename', (analysis, params) => {
      const result = service.rename(analysis, params.textDocument.uri, params.position, params.newName);
      if ('error' in result) throw new ResponseError(0, result.error);
      return result;
    }, null),
  );
  connection.onDocumentSymbol(onDocument('outline', (analysis) => service.findDocumentSymbols(analysis), [], true));
  connection.onWorkspaceSymbol((params) =>
    // Document by document, so that one that fails leaves the others' symbols in the answer.
    documents.all().flatMap((document) => {
      try {
        return service.findWorkspaceSymbols([{ uri: document.uri, analysis: cache.get(document.uri)! }], params.query);
      } catch (error) {
        failures.report('workspace symbols', document.uri, document.version, error);
        return [];
      }
    }),
  );
  const tokensOf = (uri: string, analysis: NonNullable<ReturnType<typeof analysisOf>>) => {
    const data = service.encodeSemanticTokens(analysis);
    const resultId = String(++tokenResults);
    const history = sentTokens.get(uri) ?? [];
    sentTokens.set(uri, [{ resultId, data }, ...history].slice(0, TOKEN_HISTORY));
    return { resultId, data };
  };
  connection.languages.semanticTokens.on(
    onDocument('semantic highlighting', (analysis, params) => {
      const { resultId, data } = tokensOf(params.textDocument.uri, analysis);
      return { resultId, data: service.plainNumbers(data, 0, data.length) };
    }, { resultId: '0', data: [] as number[] }, true),
  );
  connection.languages.semanticTokens.onDelta(
    onDocument(
      'semantic highlighting',
      (analysis, params) => {
        const previous = sentTokens.get(params.textDocument.uri)?.find((result) => result.resultId === params.previousResultId);
        const next = tokensOf(params.textDocument.uri, analysis);
        if (!previous) return { resultId: next.resultId, data: service.plainNumbers(next.data, 0, next.data.length) };
        return { resultId: next.resultId, edits: service.semanticTokensEdits(previous.data, next.data) };
      },
      { resultId: '0', edits: [] as { start: number; deleteCount: number; data: number[] }[] },
      true,
    ),
  );
  connection.onFoldingRanges(onDocument('folding', (analysis) => service.getFoldingRanges(analysis), []));
  connection.onSelectionRanges(onDocument('selection ranges', (analysis, params) => service.getSelectionRanges(analysis, params.positions), []));
  connection.onDocumentFormatting(onDocument('formatting', (analysis, params) => service.format(analysis.text, undefined, { indent: params.options.tabSize }), []));
  connection.onDocumentRangeFormatting(onDocument('range formatting', (analysis, params) => service.format(analysis.text, params.range, { indent: params.options.tabSize }), []));
  connection.onCodeAction(onDocument('code actions', (analysis, params) => [...service.getCodeActions(analysis, params.textDocument.uri, params.context.diagnostics), ...service.activeSpaceActions(analysis, params.textDocument.uri, params.range)], []));
  connection.languages.inlayHint.on(onDocument('inlay hints', (analysis, params) => (settings.inlayHints ? service.getInlayHints(analysis, params.range) : []), [], true));
  connection.onCodeLens(
    onDocument('code lens', (analysis, params) => {
      if (!settings.codeLens) return [];
      const uri = params.textDocument.uri;
      return [...service.getCodeLenses(analysis), ...service.computeLenses(analysis, uri, computations.policy(uri))];
    }, [], true),
  );
  connection.onExecuteCommand(
    failures.guard('the command', () => ({}), (params: { command: string; arguments?: unknown[] }) => {
      const outcome = computations.execute(params.command, params.arguments ?? []);
      if (!outcome.ok) void connection.window.showWarningMessage(`Tessera: ${outcome.message}`);
      return outcome;
    }),
  );
  connection.onRequest('tessera/levels', failures.guard('the orbital-level view', documentOf, (params: unknown) => {
    const uri = (params as { uri?: unknown } | null)?.uri;
    return typeof uri === 'string' ? computations.levels(uri, (params as { part?: unknown }).part) : null;
  }));
  connection.onShutdown(() => computations.dispose());

  connection.onRequest('tessera/report', failures.guard('the resource report', documentOf, (params: { uri: string }) => {
    const analysis = analysisOf(params.uri);
    return analysis ? { markdown: service.reportMarkdown(analysis) } : null;
  }));
  connection.onRequest('tessera/compare', failures.guard('the plan comparison', documentOf, (params: { uri: string }) => {
    const analysis = analysisOf(params.uri);
    return analysis ? service.compareAnswer(analysis, params.uri.split('/').pop() ?? 'spec') : null;
  }));
  connection.onRequest('tessera/summary', failures.guard('the status bar summary', documentOf, (params: { uri: string }) => {
    const analysis = analysisOf(params.uri);
    if (!analysis) return null;
    const largest = analysis.largestQubitCount();
    const errors = analysis.counts().errors;
    return { largestQubits: largest?.qubits ?? null, fragment: largest?.fragment ?? null, errors, limit: analysis.model.limits.qubits ?? null };
  }));
  // Data for the extension's structure view and cost panel.
  const analysisOfParams = (params: unknown) => {
    const uri = (params as { uri?: unknown } | null)?.uri;
    return typeof uri === 'string' ? analysisOf(uri) : undefined;
  };
  connection.onRequest<ReturnType<typeof service.structureAnswer> | null, void>('tessera/structure', failures.guard('the structure view', documentOf, (params: unknown) => {
    const analysis = analysisOfParams(params);
    return analysis ? service.structureAnswer(analysis) : null;
  }));
  connection.onRequest<ReturnType<typeof service.costsAnswer> | null, void>('tessera/costs', failures.guard('the cost plots', documentOf, (params: unknown) => {
    const analysis = analysisOfParams(params);
    const fragment = (params as { fragment?: unknown } | null)?.fragment;
    return analysis ? service.costsAnswer(analysis, Number.isInteger(fragment) ? (fragment as number) : null) : null;
  }));
  connection.onRequest('tessera/viewTarget', failures.guard('the structure view', documentOf, (params: unknown) => {
    const analysis = analysisOfParams(params);
    const position = (params as { position?: { line?: unknown; character?: unknown } | null } | null)?.position;
    if (!analysis || !position || !Number.isInteger(position.line) || !Number.isInteger(position.character)) return null;
    return service.viewTargetAt(analysis, { line: Math.max(0, position.line as number), character: Math.max(0, position.character as number) });
  }));

  documents.listen(connection);
  try {
    warmUp();
  } catch {
    // A failure here shows again, and is reported, when a real document takes the same path.
  }
  connection.listen();
  return connection;
}

declare const TESSERA_VERSION: string | undefined;
