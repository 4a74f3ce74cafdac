import { BrandMark } from '@/components/ui/brand-mark';
import { LoadingState } from '@/components/ui/loading-state';

/** What shows for the moment between opening the app and knowing who is signed in. */
export function AppLoading() {
  return (
    <div className="flex min-h-dvh flex-col items-center justify-center gap-2">
      <BrandMark />
      <LoadingState label="Opening Reboundry…" className="py-2" />
    </div>
  );
}
