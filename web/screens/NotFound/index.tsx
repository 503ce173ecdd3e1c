// The page for a link that leads nowhere (a mistyped or damaged address): say so and offer the way back.
import { href } from '../../router';

/** "No such page", with links to the sites and the reading form. */
export default function NotFound() {
  return (
    <>
      <h2 id="screen-title" tabIndex={-1}>No such page</h2>
      <p>This link does not lead to a page of Freshet. It may be mistyped or cut short. Nothing was changed.</p>
      <p>
        <a class="button" href={href('sites')}>Go to the sites</a>
      </p>
    </>
  );
}
