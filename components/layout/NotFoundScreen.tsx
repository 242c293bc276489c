import { Link } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { colors, type } from '@/components/theme';
import { Notice, useDocumentTitle } from '@/components/ui';

import { Content } from './Content';
import { Screen } from './Screen';

export function NotFoundScreen() {
  useDocumentTitle('Not found');
  return (
    <Screen>
      <Content>
        <Notice title="Nothing here" level={1} testID="not-found">
          <Text style={type.body}>
            This page does not exist.{' '}
            <Link href="/" style={styles.link}>
              Go to your shop
            </Link>
          </Text>
        </Notice>
      </Content>
    </Screen>
  );
}

const styles = StyleSheet.create({
  link: { color: colors.air, textDecorationLine: 'underline' },
});
