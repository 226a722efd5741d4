import { describe, expect, it } from 'vitest';
import { describeChanges } from '../../../renderer/src/audit/describe-change.ts';

describe('audit trail wording (before → after)', () => {
  it('names the row and each changed field, one level into nested objects; adds and deletes say so', () => {
    const entry = {
      projectId: 1, at: 1, user: 'u', what: 'accept e7',
      changes: [
        { table: 'corrections' as const, key: 7, before: { id: 7, eventId: 'e7', status: 'proposed', proposal: { trackingTime: 12.5, x: 1 }, updatedAt: 1 }, after: { id: 7, eventId: 'e7', status: 'accepted', proposal: { trackingTime: 12.75, x: 1 }, updatedAt: 2 } },
        { table: 'reels' as const, key: 3, after: { id: 3, title: 'Pressing' } },
        { table: 'clips' as const, key: 9, before: { id: 9, from: 1 } },
      ],
    };
    expect(describeChanges(entry)).toEqual([
      { row: 'corrections 7 e7', field: 'status', before: 'proposed', after: 'accepted' },
      { row: 'corrections 7 e7', field: 'proposal.trackingTime', before: '12.5', after: '12.75' },
      { row: 'reels 3 “Pressing”', field: '(row)', before: 'absent', after: 'added' },
      { row: 'clips 9', field: '(row)', before: 'present', after: 'deleted' },
    ]);
  });

  it('entries without row changes show their before and after as recorded', () => {
    expect(describeChanges({ projectId: 1, at: 1, user: 'u', what: 'import', after: { sourceId: 3 } })).toEqual([{ row: '', field: '', before: '—', after: '{"sourceId":3}' }]);
  });
});
