// Data screen (being built in the field-screens work).
import type { ScreenProps } from '../../app/routes';

export default function Data(_props: ScreenProps) {
  return <h2 id="screen-title" tabIndex={-1}>Data</h2>;
}
