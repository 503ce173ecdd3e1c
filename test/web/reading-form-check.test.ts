// The reading form's check-beside-the-logger field: set and cleared through the reducer, kept in the
// draft and restored from it, cleared after a save (the next reading starts as a plain one).
import { describe, expect, it } from 'vitest';
import { blankForm, formReducer, fromDraftFields, hasContent, toDraftFields } from '../../web/screens/Record/form';

describe('a check reading on the form', () => {
  it('is marked, typed, kept in the draft and restored', () => {
    let f = formReducer(blankForm('R. Tane'), { type: 'set', field: 'stageText', value: '0.742' });
    f = formReducer(f, { type: 'loggerCheck', value: '' });
    expect(f.loggerCheckText).toBe('');
    f = formReducer(f, { type: 'loggerCheck', value: '0.730' });
    const fields = toDraftFields(f);
    expect(fields.loggerCheckText).toBe('0.730');
    expect(fromDraftFields(fields, 'R. Tane')).toEqual(f);
  });

  it('is a draft worth keeping on its own, and unmarking removes it', () => {
    const marked = formReducer(blankForm(''), { type: 'loggerCheck', value: '0.73' });
    expect(hasContent(marked)).toBe(true);
    const unmarked = formReducer(marked, { type: 'loggerCheck', value: undefined });
    expect('loggerCheckText' in unmarked).toBe(false);
    expect(hasContent(unmarked)).toBe(false);
    expect('loggerCheckText' in toDraftFields(unmarked)).toBe(false);
  });

  it('is cleared after a save', () => {
    const marked = formReducer(blankForm('R. Tane'), { type: 'loggerCheck', value: '0.73' });
    expect(formReducer(marked, { type: 'saved' }).loggerCheckText).toBeUndefined();
  });
});
