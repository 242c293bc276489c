import { Link } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { Content, Screen } from './layout';
import { Notice } from './Notice';
import { colors, type } from './theme';
import { useDocumentTitle } from './useDocumentTitle';

export function NotFoundScreen() {
  useDocumentTitle('Not found');
  return (
    <Screen>
      <Content>
        <Notice title="Nothing here" testID="not-found">
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
