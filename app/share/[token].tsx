// /share/:token — a shared lesson, outside the signed-in shell so public links open signed out.
import { ShareScreen } from '@/components/screens/share/share-screen';

export default ShareScreen;
