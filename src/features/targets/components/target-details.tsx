import { useState } from 'react';
import { formatDeclination, formatRightAscension } from '@shared/coordinates';
import { sunCaution } from '@shared/sun-proximity';
import type { Target } from '@shared/schemas/targets';
import { Alert } from '@/components/ui/alert';
import { DetailItem, DetailList } from '@/components/ui/detail-list';
import { Section } from '@/components/ui/page-header';
import { TagList } from '@/components/ui/tag-list';
import { formatDateTime, formatDegrees } from '@/lib/format';

/** What is recorded about a target itself: its name, position, notes and tags. */
export function TargetDetails({ target }: { target: Target }) {
  // Until observations carry their own dates, today is the date an observer is planning for.
  const [today] = useState(() => new Date());
  const caution = sunCaution(target, today);
  return (
    <div className="grid gap-8 lg:grid-cols-[3fr_2fr]">
      {caution ? (
        <Alert kind="caution" title={caution.reason === 'is_sun' ? 'This target is the Sun.' : 'This target is close to the Sun today.'} className="lg:col-span-2">
          {caution.message}
        </Alert>
      ) : null}
      <Section title="Identifiers and coordinates">
        <DetailList>
          <DetailItem label="Designation">{target.designation}</DetailItem>
          <DetailItem label="Right ascension (J2000)" numeric>
            <span className="font-semibold">{formatRightAscension(target.raDeg)}</span>{' '}
            <span className="text-ink-soft">h m s · {formatDegrees(target.raDeg)}</span>
          </DetailItem>
          <DetailItem label="Declination (J2000)" numeric>
            <span className="font-semibold">{formatDeclination(target.decDeg)}</span>{' '}
            <span className="text-ink-soft">° ′ ″ · {formatDegrees(target.decDeg)}</span>
          </DetailItem>
          <DetailItem label="Tags">{target.tags.length > 0 ? <TagList tags={target.tags} /> : <span className="text-ink-soft">None</span>}</DetailItem>
          <DetailItem label="Added" numeric>
            {formatDateTime(target.createdAt)}
          </DetailItem>
          <DetailItem label="Last changed" numeric>
            {formatDateTime(target.updatedAt)}
          </DetailItem>
        </DetailList>
      </Section>
      <Section title="Notes">
        {target.notes.trim() ? (
          <p className="text-sm leading-relaxed whitespace-pre-wrap">{target.notes}</p>
        ) : (
          <p className="text-sm text-ink-soft italic">No notes.</p>
        )}
      </Section>
    </div>
  );
}
