import { useEffect, useState } from 'react';
import { errorText } from '../../../api/http';

/**
 * Asks a stateless calculator route a moment after the figures stop changing; keeps the last answer or the
 * server's message naming the field. `request` null means "not enough figures yet".
 */
export function useCalculation<Req, Res>(call: (req: Req) => Promise<Res>, request: Req | null, delayMs = 300) {
  const [result, setResult] = useState<Res | null>(null);
  const [error, setError] = useState<string | null>(null);
  const key = JSON.stringify(request);
  useEffect(() => {
    if (request === null) {
      setResult(null);
      setError(null);
      return;
    }
    let live = true;
    const t = setTimeout(() => {
      call(request)
        .then((r) => {
          if (!live) return;
          setResult(r);
          setError(null);
        })
        .catch((e) => {
          if (!live) return;
          setResult(null);
          setError(errorText(e));
        });
    }, delayMs);
    return () => {
      live = false;
      clearTimeout(t);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps -- callers build request inline; ask again only when its JSON changes
  }, [key]);
  return { result, error };
}
