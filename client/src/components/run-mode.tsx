import { createContext, type ReactNode, useContext, useEffect, useState } from 'react';

interface RunMode {
  /** A live run's console is on screen: the frame folds its menu away so the run's figures come first. */
  live: boolean;
  setLive: (live: boolean) => void;
}

const RunModeContext = createContext<RunMode>({ live: false, setLive: () => {} });

/** Holds run mode for the frame; a page outside it (a test rendering the console alone) changes nothing. */
export function RunModeProvider({ children }: { children: ReactNode }) {
  const [live, setLive] = useState(false);
  return <RunModeContext.Provider value={{ live, setLive }}>{children}</RunModeContext.Provider>;
}

/** Whether a live run's console is showing (the frame reads this). */
export function useRunModeActive(): boolean {
  return useContext(RunModeContext).live;
}

/** A console says it is live while `live` holds, and no longer once it closes or leaves the page. */
export function useRunMode(live: boolean): void {
  const { setLive } = useContext(RunModeContext);
  useEffect(() => {
    setLive(live);
    return () => setLive(false);
  }, [live, setLive]);
}
