// Record screen (being built in the field-screens work).
import type { ScreenProps } from '../../app/routes';

export default function Record(_props: ScreenProps) {
  return <h2 id="screen-title" tabIndex={-1}>Record</h2>;
}
