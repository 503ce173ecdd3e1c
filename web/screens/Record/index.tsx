// The Record area: choose a site, then record a reading with the form in reading-entry.tsx
// ('#/record/<siteId>[/<readingId>]'); a link to a site or reading this phone does not hold says so.
import { getReading, getSite } from '../../db';
import { useRecords } from '../../components/use-records';
import { href, type ScreenProps } from '../../router';
import { ChooseSite } from './choose-site';
import { ReadingEntry } from './reading-entry';

/** The Record area: choose a site, then the reading form ('#/record/<siteId>[/<readingId>]'). */
export default function Record({ params }: ScreenProps) {
  const { siteId, readingId } = params;
  // A link to a reading this phone does not hold (never synced here, deleted, or of another site) says so
  // rather than opening a blank form under that address.
  const site = useRecords(async () => (siteId ? getSite(siteId) : undefined), ['site'], [siteId]);
  // Read once per link (no kinds to re-read on): a reading deleted while its form is open keeps the form.
  const reading = useRecords(async () => !readingId || (await getReading(readingId))?.siteId === siteId, [], [siteId, readingId]);
  if (!siteId) return <ChooseSite />;
  if (site.state === 'loading') return <p aria-busy="true">Opening the site…</p>;
  if (site.state === 'failed') return <p class="callout bad" role="alert">{site.message}</p>;
  if (!site.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Site not found</h2>
        <p>This site is not on this phone. <a href={href('record')}>Choose another site</a></p>
      </>
    );
  }
  if (reading.state === 'ready' && !reading.value) {
    return (
      <>
        <h2 id="screen-title" tabIndex={-1}>Reading not found</h2>
        <p role="alert">This reading is not on this phone: it may have been deleted, or it was never copied here. <a href={href('sites', site.value.id)}>See the site’s readings</a> or <a href={href('record', site.value.id)}>record a new reading</a>.</p>
      </>
    );
  }
  if (reading.state === 'loading') return <p aria-busy="true">Opening the reading…</p>;
  return <ReadingEntry key={`${siteId}/${readingId ?? ''}`} site={site.value} readingId={readingId} />;
}
