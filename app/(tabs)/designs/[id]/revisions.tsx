// /designs/:id/revisions — revision history and exports (?rev= chooses the revision).
import { RevisionsScreen } from '@/components/screens/designs/revisions-screen';

export default RevisionsScreen;
