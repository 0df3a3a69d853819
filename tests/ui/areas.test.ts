/** Which navigation item a path lights up. */
import { areaForPath } from '@/shared/ui/navigation/areas';

it.each([
  ['/', 'bench'],
  ['/bench/what-if', 'bench'],
  ['/studies/42', 'studies'],
  ['/systems', 'systems'],
  ['/reviews/submit', 'reviews'],
  ['/nowhere', undefined],
])('%s belongs to %s', (path, id) => {
  expect(areaForPath(path)?.id).toBe(id);
});
