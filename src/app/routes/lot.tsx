import { useParams } from 'react-router-dom';
import { LotPlaceholder } from '@/features/lots/components/lot-placeholder';

export function Component() {
  return <LotPlaceholder id={useParams().id ?? ''} />;
}
