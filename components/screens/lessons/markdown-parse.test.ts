import { describe, expect, it } from 'vitest';
import { parseInline, parseMarkdown } from './markdown-parse';

describe('lesson notes Markdown', () => {
  it('reads headings, paragraphs joined across lines, and both kinds of list', () => {
    const blocks = parseMarkdown('# Why it works\nThe strobe\nneeds one gate.\n\n- first\n- second\n\n1. one\n2. two');
    expect(blocks.map((b) => b.kind)).toEqual(['heading', 'paragraph', 'list', 'list']);
    expect(blocks[1]).toEqual({ kind: 'paragraph', inline: [{ kind: 'text', text: 'The strobe needs one gate.' }] });
    expect(blocks[2]).toMatchObject({ ordered: false, items: [[{ text: 'first' }], [{ text: 'second' }]] });
    expect(blocks[3]).toMatchObject({ ordered: true, items: [[{ text: 'one' }], [{ text: 'two' }]] });
  });

  it('splits emphasis, strong and inline code out of a line', () => {
    expect(parseInline('a **big** and *small* `R1`')).toEqual([
      { kind: 'text', text: 'a ' },
      { kind: 'strong', text: 'big' },
      { kind: 'text', text: ' and ' },
      { kind: 'em', text: 'small' },
      { kind: 'text', text: ' ' },
      { kind: 'code', text: 'R1' },
    ]);
  });

  it('keeps raw HTML and script as plain text', () => {
    const blocks = parseMarkdown('<img src=x onerror=alert(1)> <script>alert(2)</script>');
    expect(blocks).toEqual([{ kind: 'paragraph', inline: [{ kind: 'text', text: '<img src=x onerror=alert(1)> <script>alert(2)</script>' }] }]);
  });

  it('keeps a fenced code block verbatim, Markdown inside untouched', () => {
    const blocks = parseMarkdown('```\nR1 A B 4.7k\n**not bold**\n```\nafter');
    expect(blocks[0]).toEqual({ kind: 'code', text: 'R1 A B 4.7k\n**not bold**' });
    expect(blocks[1]).toMatchObject({ kind: 'paragraph' });
  });

  it('leaves a lone star or underscore as text', () => {
    expect(parseInline('2 * 3 and a_b')).toEqual([{ kind: 'text', text: '2 * 3 and a_b' }]);
  });
});
