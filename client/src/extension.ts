/**
 * The VS Code extension: starts the Tessera language server, shows the largest fragment's qubit
 * count in the status bar, and opens the resource report, the structure view, the cost plots and
 * the orbital levels of computed parts beside the editor. No analysis here: every figure comes
 * from the language server.
 */
import * as vscode from 'vscode';
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';
import { makeNonce, reportPageHtml } from './views/html';
import { CostsPanel, LevelsPanel, StructurePanel, type ViewHost } from './views/panels';
import { RefreshScheduler } from './views/refresh';
import { comparePageHtml } from './views/compare';

let client: LanguageClient | undefined;
let statusItem: vscode.StatusBarItem | undefined;
let reportPanel: vscode.WebviewPanel | undefined;
let comparePanel: vscode.WebviewPanel | undefined;
let reportUri: string | undefined;
/** The open report renders again after a pause in typing, one render at a time (refresh.ts). */
const reportRefresh = new RefreshScheduler(() => (reportPanel ? showReport(false) : Promise.resolve()));
let structurePanel: StructurePanel | undefined;
let costsPanel: CostsPanel | undefined;
let levelsPanel: LevelsPanel | undefined;

interface Summary {
  largestQubits: number | null;
  fragment: string | null;
  errors: number;
  limit: number | null;
}

function settingsSnapshot(): Record<string, unknown> {
  const config = vscode.workspace.getConfiguration('tessera');
  return {
    defaultMapping: config.get('defaultMapping'),
    qubitLimit: config.get('qubitLimit'),
    inlayHints: { enabled: config.get('inlayHints.enabled') },
    codeLens: { enabled: config.get('codeLens.enabled') },
    meanField: { autoFunctionLimit: config.get('meanField.autoFunctionLimit') },
    jobs: { workers: config.get('jobs.workers'), memoryLimit: config.get('jobs.memoryLimit') },
  };
}

function activeSpec(): vscode.TextDocument | undefined {
  const document = vscode.window.activeTextEditor?.document;
  return document?.languageId === 'tessera' ? document : undefined;
}

async function refreshStatus(): Promise<void> {
  if (!client || !statusItem) return;
  const document = activeSpec();
  if (!document) {
    statusItem.hide();
    return;
  }
  try {
    const summary = await client.sendRequest<Summary | null>('tessera/summary', { uri: document.uri.toString() });
    if (!summary || summary.largestQubits === null) {
      statusItem.text = '$(symbol-structure) no quantum fragment';
      statusItem.tooltip = 'Tessera: no quantum-tier fragment in this spec';
    } else {
      const over = summary.limit !== null && summary.largestQubits > summary.limit;
      statusItem.text = `$(circuit-board) ${summary.largestQubits} qubits${over ? ' $(warning)' : ''}`;
      statusItem.tooltip = `Tessera: largest quantum fragment '${summary.fragment}' needs ${summary.largestQubits} qubits${summary.limit !== null ? ` (limit ${summary.limit})` : ''}. Planning estimate. Click for the resource report.`;
    }
    statusItem.show();
  } catch {
    statusItem.hide();
  }
}

/** The active spec, or else the one a view last showed (when the view itself has the focus). */
function specForView(lastUri: string | undefined): vscode.TextDocument | undefined {
  return activeSpec() ?? (lastUri ? vscode.workspace.textDocuments.find((d) => d.uri.toString() === lastUri) : undefined);
}

function showStructure(): void {
  const document = specForView(structurePanel?.visibleUri);
  if (!document || !structurePanel) {
    void vscode.window.showInformationMessage('Tessera: open a .tess spec to see its structure.');
    return;
  }
  structurePanel.show(document);
}

function showCosts(): void {
  const document = specForView(costsPanel?.visibleUri);
  if (!document || !costsPanel) {
    void vscode.window.showInformationMessage('Tessera: open a .tess spec to see its cost plots.');
    return;
  }
  costsPanel.show(document);
}

/**
 * The orbital-level view; from a code lens with the spec's URI and the part (`system` or a
 * fragment's index), from the palette for the active spec.
 */
function showLevels(uri?: unknown, part?: unknown): void {
  const fromLens = typeof uri === 'string' ? vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri) : undefined;
  const document = fromLens ?? specForView(levelsPanel?.visibleUri);
  if (!document || !levelsPanel) {
    void vscode.window.showInformationMessage('Tessera: open a .tess spec to see its orbital levels.');
    return;
  }
  const id = part === 'system' || (Number.isInteger(part) && (part as number) >= 0) ? (part as 'system' | number) : null;
  levelsPanel.showPart(document, id);
}

/** Shows the report; `reveal` false only refreshes an open one, leaving its group's tabs alone. */
async function showReport(reveal = true): Promise<void> {
  const document = activeSpec() ?? (reportUri ? vscode.workspace.textDocuments.find((d) => d.uri.toString() === reportUri) : undefined);
  if (!document || !client) {
    void vscode.window.showInformationMessage('Tessera: open a .tess spec to see its resource report.');
    return;
  }
  reportUri = document.uri.toString();
  const result = await client.sendRequest<{ markdown: string } | null>('tessera/report', { uri: reportUri });
  if (!result) return;
  const html = await vscode.commands.executeCommand<string>('markdown.api.render', result.markdown);
  if (!reportPanel) {
    reportPanel = vscode.window.createWebviewPanel('tessera.report', 'Tessera report', { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, { enableScripts: false, localResourceRoots: [] });
    reportPanel.onDidDispose(() => {
      reportPanel = undefined;
    });
  }
  reportPanel.title = `Report: ${document.uri.path.split('/').pop() ?? 'spec'}`;
  reportPanel.webview.html = reportPageHtml(reportPanel.webview.cspSource, makeNonce(), html);
  if (reveal) reportPanel.reveal(vscode.ViewColumn.Beside, true);
}

/** Shows the spec and its variants side by side (the server's `tessera/compare` Markdown). */
async function showComparison(): Promise<void> {
  const document = activeSpec();
  if (!document || !client) {
    void vscode.window.showInformationMessage('Tessera: open a .tess spec to compare its plan variants.');
    return;
  }
  const result = await client.sendRequest<{ cost: string; inputs: string; chart: string } | null>('tessera/compare', { uri: document.uri.toString() });
  if (!result) return;
  const render = (markdown: string) => vscode.commands.executeCommand<string>('markdown.api.render', markdown);
  const page = { cost: await render(result.cost), inputs: await render(result.inputs), chart: typeof result.chart === 'string' ? result.chart : '' };
  if (!comparePanel) {
    comparePanel = vscode.window.createWebviewPanel('tessera.compare', 'Tessera plans', { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, { enableScripts: false, localResourceRoots: [] });
    comparePanel.onDidDispose(() => {
      comparePanel = undefined;
    });
  }
  comparePanel.title = `Plans: ${document.uri.path.split('/').pop() ?? 'spec'}`;
  comparePanel.webview.html = comparePageHtml(comparePanel.webview.cspSource, makeNonce(), page);
  comparePanel.reveal(vscode.ViewColumn.Beside, true);
}

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const serverModule = context.asAbsolutePath('dist/server.js');
  const serverOptions: ServerOptions = {
    run: { module: serverModule, transport: TransportKind.ipc },
    debug: { module: serverModule, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6019'] } },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [{ language: 'tessera' }],
    initializationOptions: { settings: settingsSnapshot() },
    outputChannelName: 'Tessera',
  };
  client = new LanguageClient('tessera', 'Tessera', serverOptions, clientOptions);

  const viewHost: ViewHost = {
    request: <R>(method: string, params: unknown) => client?.sendRequest<R>(method, params),
    extensionUri: context.extensionUri,
    log: (line) => client?.outputChannel.appendLine(line),
  };
  structurePanel = new StructurePanel(viewHost);
  costsPanel = new CostsPanel(viewHost);
  levelsPanel = new LevelsPanel(viewHost);
  const panels = [structurePanel, costsPanel, levelsPanel];

  statusItem = vscode.window.createStatusBarItem('tessera.qubits', vscode.StatusBarAlignment.Right, 100);
  statusItem.name = 'Tessera qubits';
  statusItem.command = 'tessera.showReport';
  context.subscriptions.push(
    statusItem,
    ...panels,
    reportRefresh,
    vscode.commands.registerCommand('tessera.showReport', () => showReport()),
    vscode.commands.registerCommand('tessera.comparePlans', showComparison),
    vscode.commands.registerCommand('tessera.showStructure', showStructure),
    vscode.commands.registerCommand('tessera.showCosts', showCosts),
    vscode.commands.registerCommand('tessera.showLevels', showLevels),
    vscode.commands.registerCommand('tessera.restartServer', async () => {
      await client?.restart();
      await refreshStatus();
      for (const panel of panels) void panel.refresh();
    }),
    vscode.window.onDidChangeActiveTextEditor((editor) => {
      void refreshStatus();
      for (const panel of panels) panel.activeEditorChanged(editor);
    }),
    vscode.workspace.onDidChangeTextDocument((event) => {
      for (const panel of panels) panel.documentChanged(event.document);
      if (reportPanel && event.document.uri.toString() === reportUri) reportRefresh.changed();
    }),
    vscode.workspace.onDidCloseTextDocument((document) => {
      for (const panel of panels) panel.documentClosed(document);
    }),
    vscode.window.onDidChangeTextEditorSelection((event) => structurePanel?.selectionChanged(event.textEditor)),
    vscode.languages.onDidChangeDiagnostics((event) => {
      const active = activeSpec();
      if (!active || !event.uris.some((uri) => uri.toString() === active.uri.toString())) return;
      void refreshStatus();
      if (reportPanel && reportUri === active.uri.toString()) reportRefresh.changed();
    }),
  );
  await client.start();
  context.subscriptions.push(
    client.onNotification('tessera/settingsChanged', () => void refreshStatus()),
    // A computed result arrived (or a job was cancelled or failed): the level view shows it.
    client.onNotification('tessera/computedChanged', () => levelsPanel?.computedChanged()),
  );
  await refreshStatus();
}

export async function deactivate(): Promise<void> {
  await client?.stop();
  client = undefined;
}
