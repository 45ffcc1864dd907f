import { HomePage } from '@/features/home/components/home-page';

export function Component() {
  return <HomePage />;
}
