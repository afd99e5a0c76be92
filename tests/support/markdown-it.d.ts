/** The little of markdown-it (the Markdown renderer VS Code's preview is built on) that the tests use. */
declare module 'markdown-it' {
  interface Options {
    html?: boolean;
    linkify?: boolean;
  }
  class MarkdownIt {
    constructor(options?: Options);
    render(source: string): string;
  }
  export default MarkdownIt;
}
