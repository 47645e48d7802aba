// "/" sends people to sign-in or to their first tab.
import { Landing } from '@/components/screens/shell/landing';

export default Landing;
