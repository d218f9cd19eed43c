// The attribution typed in Settings becomes markup only through attributionHtml: text escaped,
// plain http(s) links rebuilt (issue 14.3). Checked by parsing nothing: the output is compared
// with the exact expected string.
import { describe, expect, it } from 'vitest';
import { attributionHtml } from '../../src/ui/map/attribution';

describe('map attribution as text', () => {
  it('escapes markup, keeps plain links', () => {
    expect(attributionHtml('<img src=x onerror=alert(1)>')).toBe('&#60;img src=x onerror=alert(1)&#62;');
    expect(attributionHtml('© <a href="https://www.openstreetmap.org/copyright">OpenStreetMap</a> contributors')).toBe(
      '© <a href="https://www.openstreetmap.org/copyright" rel="noopener noreferrer" target="_blank">OpenStreetMap</a> contributors',
    );
    expect(attributionHtml('<a href="javascript:alert(1)">x</a>')).toBe('&#60;a href=&#34;javascript:alert(1)&#34;&#62;x&#60;/a&#62;');
    expect(attributionHtml('<a href="https://a.org" onclick="x()">y</a>')).not.toMatch(/<a /);
  });
});
