import { Marked, type Tokens } from 'marked';
import { sectionAnchor } from './method-statement';

// docs/methods.md as HTML for the method page. The file is the repository's own, reviewed text,
// so its HTML is trusted; headings get stable anchors from their section numbers (#section-4-3)
// and each check-value definition an anchor of its own (#check-SV-1).

const NUMBERED = /^(\d+(?:\.\d+)?)\.?\s/;
const CHECK_CELL = /<td>([A-Z]{2}-\d+)<\/td>/g;

export function renderMethodStatement(markdown: string): string {
  const marked = new Marked({ gfm: true });
  marked.use({
    renderer: {
      heading(this: { parser: { parseInline: (t: Tokens.Heading['tokens']) => string } }, { tokens, depth, text }: Tokens.Heading) {
        const inner = this.parser.parseInline(tokens);
        const number = NUMBERED.exec(text)?.[1];
        if (!number) return `<h${depth}>${inner}</h${depth}>\n`;
        const id = sectionAnchor(number);
        return `<h${depth} id="${id}">${inner} <a class="section-link" href="#${id}" aria-label="Link to section ${number}">¶</a></h${depth}>\n`;
      },
    },
  });
  const html = marked.parse(markdown, { async: false });
  return html.replace(CHECK_CELL, (_, id: string) => `<td id="check-${id}">${id}</td>`);
}
