import { ParamMap } from '@angular/router';

import { AuditQuery } from '../audit.models';

export const DEFAULT_AUDIT_QUERY: AuditQuery = {
  page: 1,
  pageSize: 50,
  run: null,
  hideSignIns: false,
  person: null,
  action: null,
  entityType: null,
  from: null,
  to: null,
};
export const AUDIT_PAGE_SIZES = [25, 50, 100, 200];

const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

function positiveInteger(text: string | null): number | null {
  const value = Number(text);
  return text && Number.isInteger(value) && value > 0 ? value : null;
}

/** A run code as people type it (any case, spaces around), or a bare run id; null otherwise. */
export function runCode(text: string | null): string | null {
  const value = text?.trim().toUpperCase() ?? '';
  return /^(\d{1,9}|R-\d{4}-\d{4,6})$/.test(value) ? value : null;
}

/** Reads the trail's query from the address; anything garbled falls back to "any". */
export function auditQueryFrom(params: ParamMap): AuditQuery {
  const pageSize = Number(params.get('pageSize'));
  const action = params.get('action');
  const entityType = params.get('entityType');
  const from = params.get('from');
  const to = params.get('to');
  return {
    page: positiveInteger(params.get('page')) ?? DEFAULT_AUDIT_QUERY.page,
    pageSize: AUDIT_PAGE_SIZES.includes(pageSize) ? pageSize : DEFAULT_AUDIT_QUERY.pageSize,
    run: runCode(params.get('run')),
    hideSignIns: params.get('hideSignIns') === 'true',
    person: positiveInteger(params.get('person')),
    action: action && /^[a-z.-]+$/.test(action) ? action : null,
    entityType: entityType && /^[a-z-]+$/.test(entityType) ? entityType : null,
    from: from && ISO_DAY.test(from) ? from : null,
    to: to && ISO_DAY.test(to) ? to : null,
  };
}
