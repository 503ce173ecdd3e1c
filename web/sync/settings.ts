// The office endpoint settings: an address that must be https (or http on this machine, for testing) and
// a token. Both kept in IndexedDB (the service worker reads them too); the token goes only in a header.
import { getSyncValue, setSyncValue, type SyncSettings } from '../db';

const LOCAL_HOSTS = new Set(['localhost', '127.0.0.1', '[::1]']);

/**
 * The endpoint's base address cleaned up (no trailing slash), or a RangeError saying what is wrong: not
 * an address, not https (http only on localhost/127.0.0.1), a user name or password in it, a query or
 * fragment (a token must never travel in an address).
 */
export function checkBase(input: string): string {
  const text = input.trim();
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new RangeError('The office address must be a full web address such as https://office.example.org/freshet.');
  }
  const local = LOCAL_HOSTS.has(url.hostname);
  if (url.protocol !== 'https:' && !(url.protocol === 'http:' && local)) {
    throw new RangeError('The office address must start with https:// (plain http is only allowed for localhost or 127.0.0.1).');
  }
  if (url.username || url.password) throw new RangeError('Put no user name or password in the office address; enter the token in its own box.');
  if (url.search || url.hash) throw new RangeError('The office address must not carry a query (?…) or fragment (#…); enter the token in its own box.');
  return url.href.replace(/\/+$/, '');
}

/** The token cleaned up, or a RangeError when it is empty, has spaces inside or is implausibly long. */
export function checkToken(input: string): string {
  const token = input.trim();
  if (!token) throw new RangeError('Enter the token the office gave this phone.');
  if (/\s/.test(token) || token.length > 4096 || !/^[\x21-\x7e]+$/.test(token)) {
    throw new RangeError('The token must be one word of plain letters, digits and symbols, with no spaces.');
  }
  return token;
}

/** Checks and stores the endpoint settings; resolves with what was stored. */
export async function saveSettings(base: string, token: string): Promise<SyncSettings> {
  const settings = { base: checkBase(base), token: checkToken(token) };
  await setSyncValue('settings', settings);
  return settings;
}

/** The stored endpoint settings, or undefined when the phone has none. */
export function loadSettings(): Promise<SyncSettings | undefined> {
  return getSyncValue('settings');
}
