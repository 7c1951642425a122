// Labels that differ only in case: Lugbook renamed none of them when labels became
// case-insensitive; an admin renames one of each pair on its part page.
import { Link } from 'react-router-dom';
import { Alert } from '@/components/ui/alert';
import { paths } from '@/config/paths';
import { useLabelClashes } from '../api/get-label-clashes';

export function LabelClashes() {
  const clashes = useLabelClashes();
  if (!clashes.data || clashes.data.clashes.length === 0) return null;
  return (
    <Alert tone="info" title={`Part labels that differ only in case (${clashes.data.clashes.length})`}>
      <p>
        Labels are looked up in any case, so each group below answers as a clash until one part is renamed. Nothing was renamed for you.
      </p>
      <ul className="mt-1 list-disc pl-5">
        {clashes.data.clashes.map((c) => (
          <li key={c.key}>
            {c.parts.map((p, i) => (
              <span key={p.id}>
                {i > 0 && ' and '}
                <Link to={paths.app.part.getHref(p.id)} className="num text-accent underline">
                  {p.label}
                </Link>
              </span>
            ))}
          </li>
        ))}
      </ul>
    </Alert>
  );
}
