// The design bench: the team's designs, their scans and the rewrites found in them.
import { ComingFeatureScreen } from '@/components/screens/common/coming-feature-screen';

export function BenchScreen() {
  return (
    <ComingFeatureScreen
      testID="bench-screen"
      title="Bench"
      icon="bench"
      emptyTitle="Your team's designs will appear here"
      emptyBody="Each design will show its part totals, how it sits against each board's budget, its revisions and operating assumptions, and the rewrites a scan found in it."
      steps={[
        'Upload a netlist: a SPICE-style deck, structural Verilog or Trimwire JSON.',
        'State the operating assumptions the rest of the machine guarantees, and set board budgets.',
        'Run a scan and read each proposed rewrite: its proof, margins and the parts it saves.',
        'Apply the accepted rewrites as a new revision and export a deck to simulate and build from.',
      ]}
      caution="Margins are first-order estimates. Before a rewrite goes on a board, simulate the exported deck, check it on the bench and use the parts' data sheets for limits. Work on anything connected to mains, or anything safety-related, follows local codes and licensed practice."
    />
  );
}
