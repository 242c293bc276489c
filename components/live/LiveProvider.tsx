import { useQuery, useQueryClient } from '@tanstack/react-query';
import { createContext, useContext, useEffect, useState, type ReactNode } from 'react';
import { Platform } from 'react-native';

import {
  alarmKeys,
  dropEarlyAnswers,
  meKeys,
  meQueryOptions,
  readingKeys,
  zoneKeys,
} from '@/components/queries';

import { applyLiveMessage } from './applyLiveMessage';
import { liveUrl } from './backoff';
import { openLiveSocket, type LiveStatus } from './liveSocket';
import { parseLiveMessage } from './messages';

const LiveStatusContext = createContext<LiveStatus>('off');

/** The live connection's state, for the header's "live" mark. */
export function useLiveStatus(): LiveStatus {
  return useContext(LiveStatusContext);
}

/**
 * A status without a connection, for the server's render of a page (components/shop/FirstScreen):
 * the app connects as soon as it starts, so the page says it is connecting, not offline.
 */
export function FixedLiveStatus({ status, children }: { status: LiveStatus; children: ReactNode }) {
  return <LiveStatusContext.Provider value={status}>{children}</LiveStatusContext.Provider>;
}

/** Holds the live connection open while someone is signed in; patches the query cache. */
export function LiveProvider({ children }: { children: ReactNode }) {
  const queryClient = useQueryClient();
  const me = useQuery(meQueryOptions());
  const signedIn = me.isSuccess;
  const userId = me.data?.user.id;
  const [status, setStatus] = useState<LiveStatus>('off');

  useEffect(() => {
    if (!signedIn || !userId || Platform.OS !== 'web' || typeof window === 'undefined') return;
    return openLiveSocket({
      url: liveUrl(window.location),
      onStatus: setStatus,
      onMessage: (data) => {
        const message = parseLiveMessage(data);
        if (!message) return;
        // The page's early answers were read before this change: later queries ask again.
        dropEarlyAnswers();
        applyLiveMessage(queryClient, message);
      },
      onReconnect: () => {
        void queryClient.invalidateQueries({ queryKey: zoneKeys.all });
        void queryClient.invalidateQueries({ queryKey: readingKeys.all });
        void queryClient.invalidateQueries({ queryKey: alarmKeys.all });
      },
      // A refused handshake looks like any other failure; asking /me tells a lapsed session
      // apart, and signing out closes this socket through `signedIn`.
      onFailedAttempt: () => void queryClient.invalidateQueries({ queryKey: meKeys.all }),
    });
  }, [signedIn, userId, queryClient]);

  return <LiveStatusContext.Provider value={status}>{children}</LiveStatusContext.Provider>;
}
