import { areasFor, homeUrlFor, mayEnter, mayReturnTo } from './role-access.js';

describe('role access', () => {
  it('shows each role the navigation the brief gives it', () => {
    expect(areasFor('designer').map((area) => area.path)).toEqual(['matches', 'stock', 'builds', 'shortfall']);
    expect(areasFor('stores').map((area) => area.path)).toEqual(['matches', 'stock', 'builds']);
    expect(areasFor('purchasing').map((area) => area.path)).toEqual(['matches', 'stock', 'builds', 'shortfall']);
    expect(areasFor('admin').map((area) => area.path)).toEqual(['matches', 'stock', 'builds', 'shortfall', 'admin', 'outbox', 'settings']);
  });

  it('gives each role its first page', () => {
    expect(homeUrlFor('designer')).toBe('/matches');
    expect(homeUrlFor('stores')).toBe('/stock');
    expect(homeUrlFor('purchasing')).toBe('/shortfall');
    expect(homeUrlFor('admin')).toBe('/admin');
  });

  it('keeps the Admin area to admins', () => {
    expect(mayEnter('admin', 'admin')).toBe(true);
    expect(mayEnter('designer', 'admin')).toBe(false);
    for (const role of ['designer', 'stores', 'purchasing'] as const) expect(mayEnter(role, 'outbox')).toBe(false);
    expect(mayEnter('admin', 'outbox')).toBe(true);
    for (const role of ['designer', 'stores', 'purchasing'] as const) expect(mayEnter(role, 'settings')).toBe(false);
    expect(mayEnter('admin', 'settings')).toBe(true);
  });

  it('returns after sign-in only to an in-app page the role may open', () => {
    expect(mayReturnTo('stores', '/stock?page=2')).toBe(true);
    expect(mayReturnTo('stores', '/admin')).toBe(false);
    expect(mayReturnTo('admin', '//evil.example/admin')).toBe(false);
    expect(mayReturnTo('admin', 'https://evil.example/admin')).toBe(false);
    expect(mayReturnTo('admin', '/nowhere')).toBe(false);
    expect(mayReturnTo('admin', undefined)).toBe(false);
  });
});
