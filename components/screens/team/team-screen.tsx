// The admin's team screen: members and invites, the captured outbox, and the audit log.
// The open section lives in the URL (?section=) so it survives a reload and can be linked.
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useMe } from '@/components/data/use-me';
import { ChoiceChips, Screen, type Choice } from '@/components/ui';
import { AuditSection } from './audit-section';
import { MembersSection } from './members-section';
import { OutboxSection } from './outbox-section';

type Section = 'members' | 'outbox' | 'audit';
const SECTIONS: readonly Choice<Section>[] = [
  { value: 'members', label: 'Members' },
  { value: 'outbox', label: 'Outbox' },
  { value: 'audit', label: 'Audit log' },
];

export function TeamScreen() {
  const router = useRouter();
  const { me } = useMe();
  const params = useLocalSearchParams<{ section?: string }>();
  const section: Section = SECTIONS.some((s) => s.value === params.section) ? (params.section as Section) : 'members';
  return (
    <Screen testID="team-screen" title="Team" subtitle={me?.team.name} width="full">
      <ChoiceChips choices={SECTIONS} value={section} onChange={(next) => router.setParams({ section: next })} testID="team-section" label="Section" />
      {section === 'members' ? <MembersSection /> : section === 'outbox' ? <OutboxSection /> : <AuditSection />}
    </Screen>
  );
}
