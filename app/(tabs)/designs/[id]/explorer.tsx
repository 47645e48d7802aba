// /designs/:id/explorer — the trade-off explorer on a design's latest revision.
import { DesignExplorerScreen } from '@/components/screens/lessons/design-explorer-screen';

export default DesignExplorerScreen;
