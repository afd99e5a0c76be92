/**
 * The VS Code extension: starts the Tessera language server, shows the largest fragment's qubit
 * count in the status bar, and opens the resource report beside the editor. No analysis here.
 */
import * as vscode from 'vscode';
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';

let client: LanguageClient | undefined;
let statusItem: vscode.StatusBarItem | undefined;
let reportPanel: vscode.WebviewPanel | undefined;
let reportUri: string | undefined;

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

function webviewHtml(webview: vscode.Webview, body: string): string {
  const nonce = Array.from({ length: 32 }, () => Math.floor(Math.random() * 36).toString(36)).join('');
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src ${webview.cspSource} 'nonce-${nonce}'; img-src ${webview.cspSource} data:;">
<meta name="viewport" content="width=device-width, initial-scale=1">
<style nonce="${nonce}">
body { font-family: var(--vscode-font-family); font-size: var(--vscode-font-size); color: var(--vscode-foreground); padding: 0 1.5em; }
table { border-collapse: collapse; margin: 0.5em 0 1.2em; }
th, td { border: 1px solid var(--vscode-panel-border, #8884); padding: 0.2em 0.6em; }
td { font-variant-numeric: tabular-nums; }
blockquote { border-left: 3px solid var(--vscode-textLink-foreground); margin: 0.5em 0; padding-left: 0.8em; }
code { font-family: var(--vscode-editor-font-family); }
</style></head><body>${body}</body></html>`;
}

async function showReport(): Promise<void> {
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
  reportPanel.webview.html = webviewHtml(reportPanel.webview, html);
  reportPanel.reveal(vscode.ViewColumn.Beside, true);
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

  statusItem = vscode.window.createStatusBarItem('tessera.qubits', vscode.StatusBarAlignment.Right, 100);
  statusItem.name = 'Tessera qubits';
  statusItem.command = 'tessera.showReport';
  context.subscriptions.push(
    statusItem,
    vscode.commands.registerCommand('tessera.showReport', showReport),
    vscode.commands.registerCommand('tessera.restartServer', async () => {
      await client?.restart();
      await refreshStatus();
    }),
    vscode.window.onDidChangeActiveTextEditor(() => void refreshStatus()),
    vscode.languages.onDidChangeDiagnostics((event) => {
      const active = activeSpec();
      if (!active || !event.uris.some((uri) => uri.toString() === active.uri.toString())) return;
      void refreshStatus();
      if (reportPanel && reportUri === active.uri.toString()) void showReport();
    }),
  );
  await client.start();
  context.subscriptions.push(client.onNotification('tessera/settingsChanged', () => void refreshStatus()));
  await refreshStatus();
}

export async function deactivate(): Promise<void> {
  await client?.stop();
  client = undefined;
}
