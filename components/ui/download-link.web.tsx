// A file the server sends as a download, as a real link: the browser keeps the session cookie,
// follows Content-Disposition and names the file itself.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Icon } from './icon';
import { Text } from './text';
import type { DownloadLinkProps } from './download-link';

export function DownloadLink({ href, label, fileHint, testID, accessibilityLabel }: DownloadLinkProps) {
  const { colours, spacing, radii, sizes } = useTheme();
  // react-native-web renders a View with href as an <a>; hrefAttrs adds the download attribute.
  // The server's Content-Disposition names the file; the hint is only a fallback.
  const link = { href, hrefAttrs: { download: fileHint ?? '' } } as object;
  return (
    <View
      {...link}
      testID={testID}
      accessibilityRole="link"
      accessibilityLabel={accessibilityLabel ?? label}
      style={{
        flexDirection: 'row',
        alignItems: 'center',
        alignSelf: 'flex-start',
        gap: spacing.sm,
        minHeight: sizes.controlCompact,
        paddingHorizontal: spacing.md,
        borderRadius: radii.md,
        borderWidth: sizes.hairline,
        borderColor: colours.borderStrong,
        backgroundColor: colours.surface,
      }}
    >
      <Icon name="download" colour={colours.accent} size={sizes.iconSmall} />
      <Text variant="label" tone="accent">
        {label}
      </Text>
    </View>
  );
}
