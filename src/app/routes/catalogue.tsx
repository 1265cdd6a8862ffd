import { Page } from '../../components/page';
import { CatalogueSearch } from '../../features/catalogue/components/catalogue-search';
import { AddToComparisonButton } from '../../features/comparison/components/add-to-comparison-button';

export function Component() {
  return (
    <Page wide title="Catalogue" lead="Every released dataset, one card per dataset showing its newest version. Files of restricted releases are shared on request; their descriptions are public.">
      <CatalogueSearch actions={(item) => <AddToComparisonButton suffix={item.suffix} title={item.title.text} />} />
    </Page>
  );
}
