// /review — the link in review-request e-mails: the sign-off queue.
import { Redirect } from 'expo-router';

export default function ReviewLink() {
  return <Redirect href="/sign-off" />;
}
