import { hiddenKeyPath } from './validation.pipe.js';

describe('hiddenKeyPath (keys class-transformer would drop without a word)', () => {
  it('finds a __proto__ key that JSON.parse made an own property, at any depth', () => {
    // JSON.parse defines "__proto__" as an ordinary own property (ECMA-262, JSON.parse / InternalizeJSONProperty).
    expect(hiddenKeyPath(JSON.parse('{"a": 1, "__proto__": {"role": "administrator"}}'))).toBe('__proto__');
    expect(hiddenKeyPath(JSON.parse('{"readings": [{"value": 1}, {"constructor": {"x": 1}}]}'))).toBe('readings.1.constructor');
  });

  it('passes ordinary bodies, null-prototype objects and non-plain values', () => {
    expect(hiddenKeyPath({ title: 'Open day', readings: [{ value: 1 }] })).toBeNull();
    expect(hiddenKeyPath(Object.assign(Object.create(null), { a: 1 }))).toBeNull();
    expect(hiddenKeyPath(null)).toBeNull();
    expect(hiddenKeyPath('text')).toBeNull();
    class Socketish {
      constructor() {
        Object.defineProperty(this, 'constructor', { value: 1, enumerable: true });
      }
    }
    expect(hiddenKeyPath(new Socketish())).toBeNull();
  });
});
