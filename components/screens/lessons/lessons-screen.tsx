// Lessons: trade-offs built from a design and a chosen set of rewrites, shared read-only.
import { useMe } from '@/components/data/use-me';
import { ComingFeatureScreen } from '@/components/screens/common/coming-feature-screen';

export function LessonsScreen() {
  const { me } = useMe();
  const builds = me?.role === 'educator' || me?.role === 'admin' || me?.role === 'designer';
  return (
    <ComingFeatureScreen
      testID="lessons-screen"
      title="Lessons"
      icon="lessons"
      emptyTitle={builds ? 'Lessons will appear here' : 'Lessons shared with you will appear here'}
      emptyBody="A lesson puts a design beside a chosen set of rewrites so students can switch each one on and off and watch part counts, margins and waveforms change."
      steps={
        builds
          ? [
              'Pick a design and the proposals that show the trade-off you want to teach.',
              'Set the ranges students may explore: transistor gain, pull-up value, number of bits.',
              'Share a read-only link with your students.',
            ]
          : [
              'Open a lesson from a link your educator shares.',
              'Switch rewrites on and off and move the sliders to see what each one costs and saves.',
            ]
      }
    />
  );
}
