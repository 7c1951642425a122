// Plain text with its web addresses made clickable. Only http(s) addresses become links, so a
// message cannot smuggle in a javascript: or data: link.
const URL_RE = /\bhttps?:\/\/[^\s<>"']+[^\s<>"'.,;:!?)\]]/g;

export function LinkifiedText({ text, className }: { text: string; className?: string }) {
  const pieces: Array<string | { href: string }> = [];
  let last = 0;
  for (const match of text.matchAll(URL_RE)) {
    const start = match.index;
    if (start > last) pieces.push(text.slice(last, start));
    pieces.push({ href: match[0] });
    last = start + match[0].length;
  }
  if (last < text.length) pieces.push(text.slice(last));
  return (
    <p className={`whitespace-pre-wrap break-words ${className ?? ''}`}>
      {pieces.map((piece, i) =>
        typeof piece === 'string' ? (
          piece
        ) : (
          <a key={i} href={piece.href} className="text-accent underline underline-offset-2 hover:text-accent-strong" rel="noreferrer">
            {piece.href}
          </a>
        ),
      )}
    </p>
  );
}
