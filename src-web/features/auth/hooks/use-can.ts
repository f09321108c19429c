import { useMe } from '../api/get-me';

/**
 * Engineers manage suppliers, parts, gauges and plans; inspectors, auditors and admins read them.
 * The API refuses anyone else anyway (403); hiding the buttons saves them the attempt.
 */
export function useCanManageMasterData(): boolean {
  const { data } = useMe();
  return data?.role === 'engineer';
}
