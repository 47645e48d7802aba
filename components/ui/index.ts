// The UI primitives screens are built from.
export { Badge, type BadgeTone } from './badge';
export { Button, type ButtonProps, type ButtonVariant } from './button';
export { Card } from './card';
export { ChoiceChips, type Choice } from './choice-chips';
export { Icon, type IconName } from './icon';
export { ListRow } from './list-row';
export { Notice } from './notice';
export { Screen } from './screen';
export { EmptyState, ErrorState, Loading } from './states';
export { Text, type Tone } from './text';
export { TextField } from './text-field';
export { ToggleRow } from './toggle-row';
export { DataTable, type Column } from './data-table';
export { DownloadLink } from './download-link';
export { ProgressBar, type ProgressTone } from './progress-bar';
