import { Redirect, useRouter } from 'expo-router';
import { Text } from 'react-native';

import { Button } from '@/components/forms';
import { homeHrefFor } from '@/components/hrefs';
import { Content, Screen } from '@/components/layout';
import { isSignedOut, useMeQuery, useSignOutMutation } from '@/components/queries';
import { type } from '@/components/theme';
import { Notice, Splash } from '@/components/ui';

import { LandingScreen } from './LandingScreen';

/**
 * The front door: the first shop's overview when signed in, else the page saying what Drybench
 * does and what a shop needs, with the ways in.
 */
export function HomeScreen() {
  const router = useRouter();
  const me = useMeQuery();
  const signOut = useSignOutMutation();

  if (me.isPending) return <Splash />;
  if (isSignedOut(me.error)) return <LandingScreen />;
  if (me.isError) {
    return (
      <Screen>
        <Content>
          <Notice title="Drybench cannot load right now" level={1} testID="home-error">
            <Text style={type.body}>{me.error.message}</Text>
            <Button label="Try again" variant="quiet" onPress={() => void me.refetch()} />
          </Notice>
        </Content>
      </Screen>
    );
  }
  if (me.data.shops.length > 0) return <Redirect href={homeHrefFor(me.data.shops)} />;
  return (
    <Screen>
      <Content>
        <Notice title="No shop yet" level={1} testID="no-shop">
          <Text style={type.body}>
            You are signed in as {me.data.user.email} and belong to no shop yet. Create one for your
            workshop, or ask a shop owner to invite you.
          </Text>
          <Button
            label="Create a shop"
            onPress={() => router.push('/new-shop')}
            testID="create-shop"
          />
          <Button label="Sign out" variant="quiet" onPress={() => signOut.mutate()} />
        </Notice>
      </Content>
    </Screen>
  );
}
