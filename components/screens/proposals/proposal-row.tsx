// One proposal in a list: what it does, what it saves, and its proof, margin and status badges.
import { Pressable, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from '@/components/ui';
import type { ProposalSummary } from '@/shared/api/proposals';
import { ProposalBadges } from './proposal-badges';
import { ruleLabel, savingsPhrase } from './labels';

export function ProposalRow({ proposal, designName, selected, onPress, last }: { proposal: ProposalSummary; designName?: string; selected: boolean; onPress: () => void; last: boolean }) {
  const { colours, spacing, sizes } = useTheme();
  const saved = proposal.savings.parts;
  return (
    <Pressable
      testID={`proposal-row-${proposal.id}`}
      accessibilityRole="button"
      accessibilityLabel={`${proposal.title}; saves ${savingsPhrase(proposal.savings)}`}
      accessibilityState={{ selected }}
      onPress={onPress}
      style={({ pressed }) => ({
        paddingVertical: spacing.md,
        paddingHorizontal: spacing.lg,
        gap: spacing.sm,
        backgroundColor: selected ? colours.accentSoft : pressed ? colours.surfaceMuted : colours.transparent,
        borderBottomWidth: last ? 0 : sizes.hairline,
        borderBottomColor: colours.border,
      })}
    >
      <View style={{ flexDirection: 'row', gap: spacing.md, alignItems: 'flex-start' }}>
        <View style={{ flex: 1, gap: spacing.xxs }}>
          <Text variant="overline" tone="faint" numberOfLines={1}>
            {designName ? `${designName} · ` : ''}
            {ruleLabel(proposal.ruleId)}
          </Text>
          <Text variant="bodyStrong" numberOfLines={2}>
            {proposal.title}
          </Text>
          <Text variant="caption" tone="muted" numberOfLines={1}>
            Saves {savingsPhrase(proposal.savings)}
          </Text>
        </View>
        <View style={{ alignItems: 'flex-end' }}>
          <Text variant="title" tone={saved > 0 ? 'success' : 'muted'}>
            {saved > 0 ? `−${saved}` : saved < 0 ? `+${-saved}` : '0'}
          </Text>
          <Text variant="caption" tone="faint">
            parts
          </Text>
        </View>
      </View>
      <ProposalBadges proposal={proposal} testID={`proposal-row-${proposal.id}`} />
    </Pressable>
  );
}
