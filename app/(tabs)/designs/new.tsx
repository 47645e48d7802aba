// /designs/new — upload a design.
import { UploadScreen } from '@/components/screens/designs/upload-screen';

export default UploadScreen;
