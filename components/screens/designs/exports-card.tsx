// Downloads of one revision in every format the server writes, with the cautions beside them.
import { View } from 'react-native';
import { exportUrl } from '@/components/data/workflow-keys';
import { useTheme } from '@/components/theme/use-theme';
import { Card, DownloadLink, Text } from '@/components/ui';
import { Cautions } from '@/components/screens/proposals/cautions';
import type { ExportFormat } from '@/shared/api/revisions';

export const EXPORTS: readonly { format: ExportFormat; label: string; what: string; ext: string }[] = [
  { format: 'spice', label: 'SPICE-style deck', what: 'Simulate it before you build.', ext: 'cir' },
  { format: 'verilog', label: 'Structural Verilog', what: 'The logic view (IEEE 1364).', ext: 'v' },
  { format: 'json', label: 'Trimwire JSON', what: 'The netlist as data.', ext: 'json' },
  { format: 'bom', label: 'Bill of materials (CSV)', what: 'Parts by kind and value.', ext: 'csv' },
  { format: 'report', label: 'Review report (Markdown)', what: 'Proposals, evidence and decisions.', ext: 'md' },
  { format: 'report-html', label: 'Printable report (HTML)', what: 'The same report, ready to print.', ext: 'html' },
];

export function ExportsCard({ designId, designName, revision }: { designId: string; designName: string; revision: number }) {
  const { spacing } = useTheme();
  const base = designName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'design';
  return (
    <Card title={`Exports of revision ${revision}`} testID="design-exports">
      <View style={{ gap: spacing.md }}>
        {EXPORTS.map((e) => (
          <View key={e.format} style={{ flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: spacing.md, flexWrap: 'wrap' }}>
            <View style={{ flexShrink: 1, gap: spacing.xxs }}>
              <Text variant="bodyStrong">{e.label}</Text>
              <Text variant="caption" tone="muted">
                {e.what}
              </Text>
            </View>
            <DownloadLink
              href={exportUrl(designId, revision, e.format)}
              fileHint={`${base}-r${revision}.${e.ext}`}
              label="Download"
              testID={`export-${e.format}`}
              accessibilityLabel={`Download ${e.label} of revision ${revision}`}
            />
          </View>
        ))}
      </View>
      <Cautions testID="export-cautions" />
    </Card>
  );
}
