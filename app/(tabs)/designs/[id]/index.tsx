// /designs/:id — one design's overview.
import { DesignScreen } from '@/components/screens/designs/design-screen';

export default DesignScreen;
