// Upload a design: a netlist file (SPICE-style deck, structural Verilog or Trimwire JSON), its
// name, format and logic family, and optionally a board with its budget. A file the engine cannot
// read is refused with each problem's line and column, and nothing is stored.
import { useState } from 'react';
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import { useDesignActions } from '@/components/data/use-designs';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, ChoiceChips, Notice, Screen, Text, TextField, type Choice } from '@/components/ui';
import { pickNetlist, type PickedNetlist } from './pick-netlist';
import { locationOf, uploadProblems, type UploadProblems } from './upload-problems';

type FormatChoice = 'detect' | 'spice' | 'verilog' | 'json';
type FamilyChoice = 'detect' | 'rtl' | 'dtl' | 'cmos' | 'nmos' | 'gate';
const FORMATS: readonly Choice<FormatChoice>[] = [
  { value: 'detect', label: 'From the file' },
  { value: 'spice', label: 'SPICE-style' },
  { value: 'verilog', label: 'Verilog' },
  { value: 'json', label: 'JSON' },
];
const FAMILIES: readonly Choice<FamilyChoice>[] = [
  { value: 'detect', label: 'Detect' },
  { value: 'rtl', label: 'RTL' },
  { value: 'dtl', label: 'DTL' },
  { value: 'cmos', label: 'CMOS' },
  { value: 'nmos', label: 'NMOS' },
  { value: 'gate', label: 'Gate level' },
];

const NUMBER = /^\d+(\.\d+)?$/;

export function UploadScreen() {
  const router = useRouter();
  const { spacing, colours, radii } = useTheme();
  const { upload } = useDesignActions();
  const [picked, setPicked] = useState<PickedNetlist | null>(null);
  const [name, setName] = useState('');
  const [format, setFormat] = useState<FormatChoice>('detect');
  const [family, setFamily] = useState<FamilyChoice>('detect');
  const [boardName, setBoardName] = useState('');
  const [budget, setBudget] = useState({ parts: '', area: '', cost: '' });
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [problems, setProblems] = useState<UploadProblems | null>(null);
  const [busy, setBusy] = useState(false);

  async function choose() {
    const file = await pickNetlist();
    if (!file) return;
    setPicked(file);
    setProblems(null);
    if (!name.trim()) setName(file.name.replace(/\.[^.]+$/, ''));
  }

  async function submit() {
    const errors: Record<string, string> = {};
    if (!picked) errors.file = 'Choose a netlist file.';
    if (!name.trim()) errors.name = 'Give the design a name.';
    for (const [k, v] of Object.entries(budget)) if (v.trim() && !NUMBER.test(v.trim())) errors[k] = 'A number, like 120.';
    setFieldErrors(errors);
    if (Object.keys(errors).length || !picked) return;
    setBusy(true);
    setProblems(null);
    try {
      const design = await upload({
        file: picked.file,
        fileName: picked.name,
        name: name.trim(),
        format: format === 'detect' ? undefined : format,
        family,
        boardName: boardName.trim() || undefined,
        budgetParts: budget.parts.trim() || undefined,
        budgetAreaMm2: budget.area.trim() || undefined,
        budgetCost: budget.cost.trim() || undefined,
      });
      router.replace(`/designs/${design.id}`);
    } catch (e) {
      setProblems(uploadProblems(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <Screen testID="upload-screen" title="Upload a design" subtitle="A SPICE-style deck, structural Verilog or Trimwire JSON.">
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Bench" icon="back" variant="ghost" compact onPress={() => router.replace('/bench')} testID="upload-back" accessibilityLabel="Back to the bench" />
      </View>
      {problems ? (
        <View testID="upload-problems" accessibilityRole="alert" style={{ gap: spacing.sm }}>
          <Notice tone="warning" message={problems.summary} testID="upload-problem-summary" />
          {problems.diagnostics.map((d, i) => (
            <View key={`${d.code}-${i}`} testID={`upload-diagnostic-${i}`} style={{ backgroundColor: d.severity === 'error' ? colours.dangerSoft : colours.warningSoft, borderRadius: radii.md, padding: spacing.md, gap: spacing.xxs }}>
              <Text variant="mono" tone={d.severity === 'error' ? 'danger' : 'warning'}>
                {locationOf(d, picked?.name ?? 'file') ?? picked?.name ?? 'file'} · {d.severity === 'error' ? 'error' : 'warning'}
              </Text>
              <Text>{d.message}</Text>
            </View>
          ))}
        </View>
      ) : null}
      <Card title="Netlist">
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.md, flexWrap: 'wrap' }}>
          <Button label={picked ? 'Choose another file' : 'Choose a file'} icon="upload" variant="secondary" onPress={() => void choose()} testID="upload-pick" accessibilityLabel="Choose a netlist file" />
          <Text tone={picked ? 'default' : 'faint'} testID="upload-file-name" style={{ flexShrink: 1 }}>
            {picked ? `${picked.name}${picked.size !== null ? ` · ${(picked.size / 1024).toFixed(1)} KB` : ''}` : 'No file chosen'}
          </Text>
        </View>
        {fieldErrors.file ? (
          <Text variant="caption" tone="danger" testID="upload-file-error">
            {fieldErrors.file}
          </Text>
        ) : null}
        <TextField label="Design name" testID="upload-name" value={name} onChangeText={setName} error={fieldErrors.name} hint="As the team calls it, e.g. Wren-8 bus drivers." />
        <View style={{ gap: spacing.xs }}>
          <Text variant="label" tone="muted">
            Format
          </Text>
          <ChoiceChips choices={FORMATS} value={format} onChange={setFormat} testID="upload-format" label="Format" />
        </View>
        <View style={{ gap: spacing.xs }}>
          <Text variant="label" tone="muted">
            Logic family
          </Text>
          <ChoiceChips choices={FAMILIES} value={family} onChange={setFamily} testID="upload-family" label="Logic family" />
        </View>
      </Card>
      <Card title="Board and budget" description="Optional. The overview shows the design's use of the board against it.">
        <TextField label="Board name" testID="upload-board" value={boardName} onChangeText={setBoardName} hint="e.g. Bus board" />
        <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.md }}>
          <View style={{ flexGrow: 1, flexBasis: 0, minWidth: spacing.xxxl * 2 }}>
            <TextField label="Parts" testID="upload-budget-parts" value={budget.parts} onChangeText={(v) => setBudget({ ...budget, parts: v })} inputMode="numeric" error={fieldErrors.parts} />
          </View>
          <View style={{ flexGrow: 1, flexBasis: 0, minWidth: spacing.xxxl * 2 }}>
            <TextField label="Area (mm²)" testID="upload-budget-area" value={budget.area} onChangeText={(v) => setBudget({ ...budget, area: v })} inputMode="decimal" error={fieldErrors.area} />
          </View>
          <View style={{ flexGrow: 1, flexBasis: 0, minWidth: spacing.xxxl * 2 }}>
            <TextField label="Cost" testID="upload-budget-cost" value={budget.cost} onChangeText={(v) => setBudget({ ...budget, cost: v })} inputMode="decimal" error={fieldErrors.cost} />
          </View>
        </View>
      </Card>
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Upload" icon="upload" onPress={() => void submit()} busy={busy} testID="upload-submit" accessibilityLabel="Upload the design" />
      </View>
    </Screen>
  );
}
