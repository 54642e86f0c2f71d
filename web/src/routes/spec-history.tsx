import { PageHeader } from '../components/ui/page-header';

export function Component() {
  return <PageHeader title="Coming next" />;
}
