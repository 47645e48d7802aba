// /designs/:id/proposals — the design's proposals with filters and sort (in the query).
import { ProposalsScreen } from '@/components/screens/proposals/proposals-screen';

export default ProposalsScreen;
