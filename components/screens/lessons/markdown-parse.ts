// A small Markdown reader for lesson notes: paragraphs, headings, lists, emphasis, inline code and
// code blocks, into plain data. Raw HTML is never interpreted — it stays text, so notes can only
// ever be rendered as text nodes.
export type Inline = { kind: 'text' | 'strong' | 'em' | 'code'; text: string };

export type Block =
  | { kind: 'heading'; level: 1 | 2 | 3; inline: Inline[] }
  | { kind: 'paragraph'; inline: Inline[] }
  | { kind: 'list'; ordered: boolean; items: Inline[][] }
  | { kind: 'code'; text: string };

const INLINE = /(\*\*[^*\n]+?\*\*|__[^_\n]+?__|`[^`\n]+`|\*[^*\s][^*\n]*?\*|_[^_\s][^_\n]*?_)/;

/** Splits one line of text into plain runs, **strong**, *emphasis* and `code`. */
export function parseInline(text: string): Inline[] {
  const out: Inline[] = [];
  const push = (kind: Inline['kind'], t: string) => {
    if (!t) return;
    const last = out[out.length - 1];
    if (kind === 'text' && last?.kind === 'text') last.text += t;
    else out.push({ kind, text: t });
  };
  for (const part of text.split(INLINE)) {
    if (!part) continue;
    if ((part.startsWith('**') && part.endsWith('**') && part.length > 4) || (part.startsWith('__') && part.endsWith('__') && part.length > 4)) push('strong', part.slice(2, -2));
    else if (part.startsWith('`') && part.endsWith('`') && part.length > 2) push('code', part.slice(1, -1));
    else if ((part.startsWith('*') && part.endsWith('*') && part.length > 2) || (part.startsWith('_') && part.endsWith('_') && part.length > 2)) push('em', part.slice(1, -1));
    else push('text', part);
  }
  return out;
}

const HEADING = /^(#{1,6})\s+(.*)$/;
const BULLET = /^\s*[-*+]\s+(.*)$/;
const NUMBERED = /^\s*\d+[.)]\s+(.*)$/;

export function parseMarkdown(source: string): Block[] {
  const lines = source.replace(/\r\n?/g, '\n').split('\n');
  const blocks: Block[] = [];
  let para: string[] = [];
  const flush = () => {
    if (para.length) blocks.push({ kind: 'paragraph', inline: parseInline(para.join(' ')) });
    para = [];
  };
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i]!;
    if (/^\s*```/.test(line)) {
      flush();
      const code: string[] = [];
      i++;
      while (i < lines.length && !/^\s*```/.test(lines[i]!)) code.push(lines[i++]!);
      blocks.push({ kind: 'code', text: code.join('\n') });
      continue;
    }
    if (!line.trim()) {
      flush();
      continue;
    }
    const h = HEADING.exec(line);
    if (h) {
      flush();
      const level = Math.min(3, h[1]!.length) as 1 | 2 | 3;
      blocks.push({ kind: 'heading', level, inline: parseInline(h[2]!.trim()) });
      continue;
    }
    const b = BULLET.exec(line) ?? NUMBERED.exec(line);
    if (b) {
      flush();
      const ordered = !BULLET.test(line);
      const last = blocks[blocks.length - 1];
      const item = parseInline(b[1]!.trim());
      if (last?.kind === 'list' && last.ordered === ordered) last.items.push(item);
      else blocks.push({ kind: 'list', ordered, items: [item] });
      continue;
    }
    para.push(line.trim());
  }
  flush();
  return blocks;
}
