/**
 * The structure view, the cost panel and the orbital-level view on the extension side: webview
 * panels beside the spec that ask the language server for their data (`tessera/structure`,
 * `tessera/costs`, `tessera/viewTarget`, `tessera/levels`), follow the spec as it is edited, and act on the views' messages once
 * they pass their checks (protocol.ts). No analysis here.
 */
import * as vscode from 'vscode';
import { makeNonce, viewPage, type ViewKind } from './html';
import {
  checkCosts,
  checkCostsViewMessage,
  checkLevels,
  checkLevelsViewMessage,
  checkStructure,
  checkStructureViewMessage,
  decodePngDataUrl,
  unavailableReason,
  type CostsHostMessage,
  type LevelsHostMessage,
  type PartId,
  type ViewLevels,
  type PlotName,
  type StructureHostMessage,
  type ViewCosts,
  type ViewStructure,
} from './protocol';
import { RefreshScheduler } from './refresh';

/** Quiet time after the last cursor move before the structure view's highlight follows it. */
const CURSOR_DELAY_MS = 80;

export interface ViewHost {
  /** The running language client, if any. */
  request<R>(method: string, params: unknown): Promise<R> | undefined;
  extensionUri: vscode.Uri;
  log(line: string): void;
}

function fileName(uri: string): string {
  return decodeURIComponent(uri.split('/').pop() ?? 'spec');
}

/** A webview panel beside the editor that shows one spec at a time and follows the active spec. */
abstract class SpecPanel<HostMessage> implements vscode.Disposable {
  protected panel: vscode.WebviewPanel | undefined;
  protected uri: string | undefined;
  /** Edits refresh the view after a pause in typing, one refresh at a time (refresh.ts). */
  private readonly edits = new RefreshScheduler(() => (this.panel ? this.refresh() : Promise.resolve()));
  /** Answers to earlier requests are dropped when a later one was sent. */
  private generation = 0;

  constructor(
    protected readonly host: ViewHost,
    private readonly kind: ViewKind,
    private readonly viewType: string,
    private readonly label: string,
  ) {}

  get visibleUri(): string | undefined {
    return this.panel ? this.uri : undefined;
  }

  show(document: vscode.TextDocument): void {
    this.uri = document.uri.toString();
    if (this.panel) {
      this.panel.title = this.title();
      this.panel.reveal(vscode.ViewColumn.Beside, true);
      void this.refresh();
      return;
    }
    const root = vscode.Uri.joinPath(this.host.extensionUri, 'dist', 'webview');
    const panel = vscode.window.createWebviewPanel(this.viewType, this.title(), { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, { enableScripts: true, localResourceRoots: [root] });
    this.panel = panel;
    panel.webview.html = viewPage({
      kind: this.kind,
      cspSource: panel.webview.cspSource,
      scriptUri: panel.webview.asWebviewUri(vscode.Uri.joinPath(root, `${this.kind}.js`)).toString(),
      nonce: makeNonce(),
      title: this.title(),
    });
    panel.webview.onDidReceiveMessage((raw: unknown) => this.receive(raw));
    panel.onDidDispose(() => {
      this.panel = undefined;
    });
  }

  /** The spec changed: ask again after a pause in typing. */
  documentChanged(document: vscode.TextDocument): void {
    if (!this.panel || document.uri.toString() !== this.uri) return;
    this.edits.changed();
  }

  /** Another spec became active: show that one. */
  activeEditorChanged(editor: vscode.TextEditor | undefined): void {
    const document = editor?.document;
    if (!this.panel || document?.languageId !== 'tessera' || document.uri.toString() === this.uri) return;
    this.uri = document.uri.toString();
    this.panel.title = this.title();
    void this.refresh();
  }

  documentClosed(document: vscode.TextDocument): void {
    if (!this.panel || document.uri.toString() !== this.uri) return;
    this.post(this.unavailable(`${fileName(this.uri)} was closed; open a .tess spec to see it here.`));
  }

  dispose(): void {
    this.edits.dispose();
    this.panel?.dispose();
  }

  protected title(): string {
    return `${this.label}: ${fileName(this.uri ?? '')}`;
  }

  protected post(message: HostMessage): void {
    void this.panel?.webview.postMessage(message);
  }

  /** Sends a request for the current spec; undefined when a later request overtook it. */
  protected async ask<R>(method: string, params: Record<string, unknown>): Promise<{ result: R | null } | undefined> {
    const uri = this.uri;
    const request = uri ? this.host.request<R | null>(method, { uri, ...params }) : undefined;
    if (!uri || !request) return { result: null };
    const generation = ++this.generation;
    try {
      const result = await request;
      return generation === this.generation && uri === this.uri ? { result } : undefined;
    } catch (error) {
      this.host.log(`[views] ${method} failed: ${(error as Error).message}`);
      return generation === this.generation ? { result: null } : undefined;
    }
  }

  protected async revealLine(line: number): Promise<void> {
    if (!this.uri) return;
    const uri = this.uri;
    const document = await vscode.workspace.openTextDocument(vscode.Uri.parse(uri));
    if (line < 0 || line >= document.lineCount) return;
    const visible = vscode.window.visibleTextEditors.find((editor) => editor.document.uri.toString() === uri);
    const editor = await vscode.window.showTextDocument(document, { viewColumn: visible?.viewColumn ?? vscode.ViewColumn.One, preserveFocus: false });
    const text = document.lineAt(line);
    editor.selection = new vscode.Selection(new vscode.Position(line, text.firstNonWhitespaceCharacterIndex), text.range.end);
    editor.revealRange(text.range, vscode.TextEditorRevealType.InCenterIfOutsideViewport);
  }

  protected ignored(reason: string): void {
    this.host.log(`[views] ${this.kind} view message ignored: ${reason}`);
  }

  abstract refresh(): Promise<void>;
  protected abstract receive(raw: unknown): void;
  protected abstract unavailable(message: string): HostMessage;
}

export class StructurePanel extends SpecPanel<StructureHostMessage> {
  private data: ViewStructure | undefined;
  private cursorTimer: ReturnType<typeof setTimeout> | undefined;

  constructor(host: ViewHost) {
    super(host, 'structure', 'tessera.structure', 'Structure');
  }

  async refresh(): Promise<void> {
    const answer = await this.ask<unknown>('tessera/structure', {});
    if (!answer) return;
    if (answer.result === null) {
      this.data = undefined;
      this.post(this.unavailable('The language server has no analysis of this spec; open it in an editor.'));
      return;
    }
    const reason = unavailableReason(answer.result);
    if (reason !== undefined) {
      this.data = undefined;
      this.post(this.unavailable(reason));
      return;
    }
    const checked = checkStructure(answer.result);
    if (!checked.ok) {
      // Shown as well as logged: a view that silently keeps old data misleads.
      this.host.log(`[views] structure data refused: ${checked.reason}`);
      this.data = undefined;
      this.post(this.unavailable(`Tessera cannot show this structure: ${checked.reason}.`));
      return;
    }
    this.data = checked.value;
    this.post({ type: 'structure', title: this.title(), data: checked.value });
  }

  /** The cursor moved in a spec: highlight the fragment whose block it is in, and its atom. */
  selectionChanged(editor: vscode.TextEditor): void {
    if (!this.panel || editor.document.uri.toString() !== this.uri) return;
    if (this.cursorTimer) clearTimeout(this.cursorTimer);
    const position = editor.selection.active;
    this.cursorTimer = setTimeout(() => void this.highlightAt(position), CURSOR_DELAY_MS);
  }

  private async highlightAt(position: vscode.Position): Promise<void> {
    if (!this.uri) return;
    const target = await Promise.resolve(this.host.request<{ fragment: number | null; atom: number | null } | null>('tessera/viewTarget', { uri: this.uri, position: { line: position.line, character: position.character } })).catch(
      (error: Error) => {
        this.host.log(`[views] tessera/viewTarget failed: ${error.message}`);
        return null;
      },
    );
    if (target) this.post({ type: 'highlight', fragment: target.fragment, atom: target.atom });
  }

  protected receive(raw: unknown): void {
    const checked = checkStructureViewMessage(raw, { atoms: this.data?.atoms.length ?? 0, fragments: this.data?.fragments.length ?? 0 });
    if (!checked.ok) return this.ignored(checked.reason);
    const message = checked.value;
    switch (message.type) {
      case 'ready': {
        void this.refresh();
        const editor = vscode.window.visibleTextEditors.find((e) => e.document.uri.toString() === this.uri);
        if (editor) this.selectionChanged(editor);
        break;
      }
      case 'revealAtom': {
        const line = this.data!.atoms[message.atom]!.line;
        if (line < 0) void vscode.window.showInformationMessage('Tessera: this atom comes from an XYZ file; its line is in that file.');
        else void this.revealLine(line);
        break;
      }
      case 'revealFragment':
        void this.revealLine(this.data!.fragments[message.fragment]!.line);
        break;
    }
  }

  protected unavailable(message: string): StructureHostMessage {
    return { type: 'unavailable', message };
  }
}

const PLOT_TITLES: Record<PlotName, string> = { qubits: 'qubits per fragment', growth: 'active-space growth', shots: 'shots against active-space size', scan: 'scan' };

export class CostsPanel extends SpecPanel<CostsHostMessage> {
  private data: ViewCosts | undefined;
  private selected: number | null = null;

  constructor(host: ViewHost) {
    super(host, 'costs', 'tessera.costs', 'Costs');
  }

  async refresh(): Promise<void> {
    const answer = await this.ask<unknown>('tessera/costs', { fragment: this.selected });
    if (!answer) return;
    if (answer.result === null) {
      this.data = undefined;
      this.post(this.unavailable('The language server has no analysis of this spec; open it in an editor.'));
      return;
    }
    const reason = unavailableReason(answer.result);
    if (reason !== undefined) {
      this.data = undefined;
      this.post(this.unavailable(reason));
      return;
    }
    const checked = checkCosts(answer.result);
    if (!checked.ok) {
      this.host.log(`[views] cost data refused: ${checked.reason}`);
      this.data = undefined;
      this.post(this.unavailable(`Tessera cannot show these plots: ${checked.reason}.`));
      return;
    }
    this.data = checked.value;
    this.selected = checked.value.selected;
    this.post({ type: 'costs', title: this.title(), data: checked.value });
  }

  protected receive(raw: unknown): void {
    const checked = checkCostsViewMessage(raw, { fragments: this.data?.fragments.map((f) => f.index) ?? [] });
    if (!checked.ok) return this.ignored(checked.reason);
    const message = checked.value;
    switch (message.type) {
      case 'ready':
        void this.refresh();
        break;
      case 'selectFragment':
        this.selected = message.fragment;
        void this.refresh();
        break;
      case 'exportSvg':
        if (this.data) void this.save(message.plot, 'svg', new TextEncoder().encode(this.data.svg[message.plot]));
        break;
      case 'exportPng': {
        const image = decodePngDataUrl(message.dataUrl);
        if (image.ok) void this.save(message.plot, 'png', image.value);
        break;
      }
    }
  }

  private async save(plot: PlotName, extension: 'svg' | 'png', bytes: Uint8Array): Promise<void> {
    const uri = this.uri ? vscode.Uri.parse(this.uri) : undefined;
    const stem = fileName(this.uri ?? 'spec').replace(/\.tess$/, '');
    const folder = uri?.scheme === 'file' ? vscode.Uri.joinPath(uri, '..') : vscode.workspace.workspaceFolders?.[0]?.uri;
    const target = await vscode.window.showSaveDialog({
      ...(folder ? { defaultUri: vscode.Uri.joinPath(folder, `${stem}-${plot}.${extension}`) } : {}),
      filters: extension === 'svg' ? { 'SVG image': ['svg'] } : { 'PNG image': ['png'] },
      saveLabel: 'Export',
      title: `Export the ${PLOT_TITLES[plot]} chart as ${extension.toUpperCase()} (planning estimate)`,
    });
    if (!target) return;
    try {
      await vscode.workspace.fs.writeFile(target, bytes);
      void vscode.window.showInformationMessage(`Tessera: saved ${vscode.workspace.asRelativePath(target)}`);
    } catch (error) {
      void vscode.window.showErrorMessage(`Tessera: could not save ${target.fsPath}: ${(error as Error).message}`);
    }
  }

  protected unavailable(message: string): CostsHostMessage {
    return { type: 'unavailable', message };
  }
}

export class LevelsPanel extends SpecPanel<LevelsHostMessage> {
  private data: ViewLevels | undefined;
  private selected: PartId | null = null;

  constructor(host: ViewHost) {
    super(host, 'levels', 'tessera.levels', 'Orbital levels');
  }

  /** Opens the view on a spec, showing one part (from a code lens) or the first with a result. */
  showPart(document: vscode.TextDocument, part: PartId | null): void {
    if (part !== null) this.selected = part;
    this.show(document);
  }

  /** A result arrived or a job moved on: ask again. */
  computedChanged(): void {
    if (this.panel) void this.refresh();
  }

  async refresh(): Promise<void> {
    const answer = await this.ask<unknown>('tessera/levels', { part: this.selected });
    if (!answer) return;
    if (answer.result === null) {
      this.data = undefined;
      this.post(this.unavailable('The language server has no analysis of this spec; open it in an editor.'));
      return;
    }
    const checked = checkLevels(answer.result);
    if (!checked.ok) {
      this.host.log(`[views] level data refused: ${checked.reason}`);
      return;
    }
    this.data = checked.value;
    this.selected = checked.value.selected;
    this.post({ type: 'levels', title: this.title(), data: checked.value });
  }

  protected receive(raw: unknown): void {
    const checked = checkLevelsViewMessage(raw, { parts: this.data?.parts.map((part) => part.id) ?? [] });
    if (!checked.ok) return this.ignored(checked.reason);
    const message = checked.value;
    switch (message.type) {
      case 'ready':
        void this.refresh();
        break;
      case 'selectPart':
        this.selected = message.part;
        void this.refresh();
        break;
      case 'exportSvg':
        if (this.data?.svg) void this.save(this.data.svg);
        break;
    }
  }

  private async save(svg: string): Promise<void> {
    const uri = this.uri ? vscode.Uri.parse(this.uri) : undefined;
    const stem = fileName(this.uri ?? 'spec').replace(/\.tess$/, '');
    const part = this.selected === null ? 'levels' : this.selected === 'system' ? 'system-levels' : `fragment-${this.selected + 1}-levels`;
    const folder = uri?.scheme === 'file' ? vscode.Uri.joinPath(uri, '..') : vscode.workspace.workspaceFolders?.[0]?.uri;
    const target = await vscode.window.showSaveDialog({
      ...(folder ? { defaultUri: vscode.Uri.joinPath(folder, `${stem}-${part}.svg`) } : {}),
      filters: { 'SVG image': ['svg'] },
      saveLabel: 'Export',
      title: 'Export the orbital levels as SVG (computed)',
    });
    if (!target) return;
    try {
      await vscode.workspace.fs.writeFile(target, new TextEncoder().encode(svg));
      void vscode.window.showInformationMessage(`Tessera: saved ${vscode.workspace.asRelativePath(target)}`);
    } catch (error) {
      void vscode.window.showErrorMessage(`Tessera: could not save ${target.fsPath}: ${(error as Error).message}`);
    }
  }

  protected unavailable(message: string): LevelsHostMessage {
    return { type: 'unavailable', message };
  }
}
