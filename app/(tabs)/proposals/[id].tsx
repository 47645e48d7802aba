// /proposals/:id — one proposal by id alone (the link in decision e-mails).
import { ProposalScreen } from '@/components/screens/proposals/proposal-screen';

export default ProposalScreen;
