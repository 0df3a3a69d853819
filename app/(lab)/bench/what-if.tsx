import { WhatIfScreen } from '@/shared/ui/screens/what-if/what-if-screen';

/** /bench/what-if — the quick what-if bench (linked from the Bench). */
export default function WhatIfRoute() {
  return <WhatIfScreen />;
}
