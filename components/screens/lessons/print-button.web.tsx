// Print on the web: the browser's own print dialog (the handout page is laid out for paper).
import { Button } from '@/components/ui';

export function PrintButton({ testID }: { testID: string }) {
  return <Button label="Print" icon="download" variant="secondary" compact onPress={() => window.print()} testID={testID} accessibilityLabel="Print this page" />;
}
