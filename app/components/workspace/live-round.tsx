import { useEffect, useRef } from "react";
import { href, useRevalidator } from "react-router";

/** Every change to a round's runs, series or claims re-checks it, so `checkedAt` moves with them. */
type RoundState = { checkedAt: string | null; state: string };

const POLL_MS = 4000;

/**
 * Keeps a round's pages current when its runs change elsewhere — a script pushing runs through
 * the API, or a co-author in another tab. Every few seconds, while the tab is visible, it reads
 * the round's API resource route (the session cookie is accepted for GETs); when the round was
 * re-checked since the page's data was loaded, the page's loaders revalidate, so the flags
 * panel, counts and runs table update without a reload.
 *
 * Plain fetch rather than a fetcher on purpose: a fetcher turns a 4xx (an expired session, the
 * rate limit) into the route's error page, and a background poll must never do that.
 */
export function LiveRound({ submissionId, round, loaded }: { submissionId: string; round: number; loaded: RoundState }) {
  const revalidator = useRevalidator();
  const seen = useRef(loaded);
  seen.current = loaded;
  const busy = useRef(revalidator.state !== "idle");
  busy.current = revalidator.state !== "idle";
  const { revalidate } = revalidator;
  const url = href("/api/v1/submissions/:submissionId/rounds/:round", { submissionId, round: String(round) });

  useEffect(() => {
    let inFlight = false;
    const tick = async () => {
      if (inFlight || busy.current || document.visibilityState !== "visible") return;
      inFlight = true;
      try {
        const res = await fetch(url, { headers: { accept: "application/json" } });
        if (!res.ok) return;
        const fresh = (await res.json()) as RoundState;
        if (fresh.checkedAt !== seen.current.checkedAt || fresh.state !== seen.current.state) await revalidate();
      } catch {
        // Offline or the server restarting: the next tick tries again.
      } finally {
        inFlight = false;
      }
    };
    const timer = window.setInterval(tick, POLL_MS);
    const onVisible = () => void tick();
    document.addEventListener("visibilitychange", onVisible);
    return () => {
      window.clearInterval(timer);
      document.removeEventListener("visibilitychange", onVisible);
    };
  }, [url, revalidate]);

  return null;
}
