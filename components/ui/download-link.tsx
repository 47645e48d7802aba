// A file the server sends as a download. Native: opened by the system (the session cookie goes
// with the app's own requests only, so the server must be reached in the same browser session).
import { Linking } from 'react-native';
import { Button } from './button';

export type DownloadLinkProps = { href: string; label: string; fileHint?: string; testID: string; accessibilityLabel?: string };

export function DownloadLink({ href, label, testID, accessibilityLabel }: DownloadLinkProps) {
  return <Button label={label} icon="download" variant="secondary" compact onPress={() => void Linking.openURL(href)} testID={testID} accessibilityLabel={accessibilityLabel} />;
}
