// The design bench: the team's designs; on wide windows the chosen design's overview sits beside
// the list, on phones it replaces the list. The chosen design lives in the URL (?design=).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useDesigns } from '@/components/data/use-designs';
import { useMe } from '@/components/data/use-me';
import { TwoPane } from '@/components/navigation/two-pane';
import { Button, EmptyState, ErrorState, Loading, Screen } from '@/components/ui';
import { DesignList } from '@/components/screens/designs/design-list';
import { DesignOverview } from '@/components/screens/designs/design-overview';

export function BenchScreen() {
  const router = useRouter();
  const { me } = useMe();
  const params = useLocalSearchParams<{ design?: string }>();
  const { designs, error, isLoading, retry } = useDesigns();
  const canUpload = me?.role === 'designer' || me?.role === 'admin';
  const uploadButton = canUpload ? <Button label="Upload a design" icon="upload" compact onPress={() => router.push('/designs/new')} testID="bench-upload" /> : undefined;
  const frame = (body: React.ReactNode) => (
    <Screen testID="bench-screen" title="Bench" subtitle={me?.team.name} width="full" headerAccessory={uploadButton}>
      {body}
    </Screen>
  );

  if (error) return frame(<ErrorState error={error} onRetry={retry} testID="bench-error" />);
  if (isLoading || !designs) return frame(<Loading label="Loading the team's designs…" testID="bench-loading" />);
  if (designs.length === 0) {
    return frame(
      <EmptyState
        icon="bench"
        title="No designs yet"
        body={canUpload ? 'Upload a netlist — a SPICE-style deck, structural Verilog or Trimwire JSON — to count its parts and scan it for rewrites.' : 'When a designer uploads a netlist it appears here with its part totals, scans and proposals.'}
        testID="bench-empty"
      />,
    );
  }
  const selected = designs.some((d) => d.id === params.design) ? params.design! : null;
  return frame(
    <TwoPane
      testID="bench"
      list={<DesignList designs={designs} selected={selected} onSelect={(id) => router.setParams({ design: id })} />}
      detail={selected ? <DesignOverview id={selected} /> : null}
      placeholder={<EmptyState icon="bench" title="Choose a design" body="Its part totals, scan, budgets, assumptions and revisions show here." testID="bench-placeholder" />}
      onBack={() => router.setParams({ design: '' })}
      backLabel="All designs"
    />,
  );
}
