// /designs/:id/proposals/:pid — one proposal.
import { ProposalScreen } from '@/components/screens/proposals/proposal-screen';

export default ProposalScreen;
