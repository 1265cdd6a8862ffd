import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useOpenApi } from '../../features/site/api/get-openapi';
import { ApiReference } from '../../features/site/components/api-reference';

export function Component() {
  const doc = useOpenApi();
  return (
    <Page wide title="API reference" lead="The REST API for scripts: catalogue, releases, statistics, downloads and deposits.">
      <QueryState query={doc}>{(d) => <ApiReference doc={d} />}</QueryState>
    </Page>
  );
}
