// Test helper: a small XML well-formedness check (XML 1.0 §2.1 in miniature: one root element,
// tags properly nested and closed, attribute values quoted, no '<' in text or attributes, '&'
// only in the entities &amp; &lt; &gt; &quot; &apos; or character references), and element counts.

export function checkXml(text: string): { ok: true; counts: Map<string, number> } | { ok: false; error: string } {
  const counts = new Map<string, number>();
  const stack: string[] = [];
  let i = 0, roots = 0;
  const entityOk = (s: string) => !/&(?!(amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/.test(s);
  while (i < text.length) {
    const lt = text.indexOf('<', i);
    const chunk = lt < 0 ? text.slice(i) : text.slice(i, lt);
    if (!entityOk(chunk)) return { ok: false, error: `bad & in text near ${i}` };
    if (stack.length === 0 && chunk.trim() !== '') return { ok: false, error: `text outside the root near ${i}` };
    if (lt < 0) break;
    if (text.startsWith('<!--', lt)) { const e = text.indexOf('-->', lt); if (e < 0) return { ok: false, error: 'unclosed comment' }; i = e + 3; continue; }
    if (text.startsWith('<?', lt)) { const e = text.indexOf('?>', lt); if (e < 0) return { ok: false, error: 'unclosed declaration' }; i = e + 2; continue; }
    const gt = text.indexOf('>', lt);
    if (gt < 0) return { ok: false, error: `unclosed tag at ${lt}` };
    const tag = text.slice(lt + 1, gt);
    if (tag.startsWith('/')) {
      const name = tag.slice(1).trim();
      if (stack.pop() !== name) return { ok: false, error: `mismatched </${name}> at ${lt}` };
    } else {
      const selfClose = tag.endsWith('/');
      const m = /^([A-Za-z_][\w:.-]*)((?:\s+[A-Za-z_][\w:.-]*\s*=\s*(?:"[^"<]*"|'[^'<]*'))*)\s*\/?$/.exec(tag);
      if (!m) return { ok: false, error: `malformed tag <${tag.slice(0, 60)}> at ${lt}` };
      if (!entityOk(m[2])) return { ok: false, error: `bad & in attributes of <${m[1]}>` };
      const names = [...m[2].matchAll(/([A-Za-z_][\w:.-]*)\s*=/g)].map((x) => x[1]);
      if (new Set(names).size !== names.length) return { ok: false, error: `repeated attribute in <${m[1]}>` };
      if (stack.length === 0) roots++;
      counts.set(m[1], (counts.get(m[1]) ?? 0) + 1);
      if (!selfClose) stack.push(m[1]);
    }
    i = gt + 1;
  }
  if (stack.length > 0) return { ok: false, error: `unclosed <${stack[stack.length - 1]}>` };
  if (roots !== 1) return { ok: false, error: `expected one root element, got ${roots}` };
  return { ok: true, counts };
}
