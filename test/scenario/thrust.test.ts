import { describe, expect, it } from 'vitest';
import { loadThrustCurve, MAX_THRUST_ROWS, parseThrustCsv, resolveRelativePath, thrustCurveFromRows } from '../../src/scenario/thrust.js';

describe('CSV thrust curves', () => {
  it('reads comma, semicolon, tab and space separated rows with an optional header', () => {
    const expected = { time: [0, 0.1, 1.2], thrust: [0, 120, 0] };
    for (const text of [
      'time_s,thrust_N\n0,0\n0.1,120\n1.2,0\n',
      '0;0\r\n0.1;120\r\n1.2;0',
      '# measured on a test stand\n0\t0\n\n0.1\t120\n1.2\t0\n',
      'Time (s)  Thrust (N)\n0 0\n0.1   120\n1.2 0',
      '\uFEFF0, 0\n0.1, 120,\n1.2, 0',
    ]) {
      expect(parseThrustCsv(text, 'motor.csv')).toEqual({ curve: expected, issues: [] });
    }
  });

  it('names the line of a non-numeric row', () => {
    const { curve, issues } = parseThrustCsv('t,F\n0,0\n0.1,12x\n1,0\n', 'motor.csv');
    expect(curve).toBeUndefined();
    expect(issues).toEqual([{ path: 'vehicle.motor.thrust', message: "'motor.csv' line 3: '0.1,12x' is not two numbers (time s, thrust N)" }]);
  });

  it('treats only the first line as a possible header', () => {
    const { issues } = parseThrustCsv('t,F\n0,0\ntime,thrust\n1,5\n', 'motor.csv');
    expect(issues[0]!.message).toContain("line 3: 'time,thrust'");
  });

  it('rejects a third column, an empty field and non-decimal numbers', () => {
    for (const bad of ['0,0,0', '0,,5', '0x1,5', 'Infinity,5', '1e,5']) {
      const { issues } = parseThrustCsv(`0,0\n${bad}\n2,0`, 'm.csv');
      expect(issues.map((i) => i.message).join()).toContain('line 2');
    }
  });

  it('names the line of an out-of-order time and of a negative thrust', () => {
    const { issues } = parseThrustCsv('0,0\n0.5,10\n0.4,12\n0.6,-1\n', 'm.csv');
    expect(issues.map((i) => i.message)).toEqual([
      "'m.csv' line 3: time 0.4 s is not after the previous row's 0.5 s; times must strictly increase",
      "'m.csv' line 4: thrust -1 N is negative; thrust must be 0 or more",
    ]);
  });

  it('rejects a curve starting after 0 rather than padding it', () => {
    const { issues } = parseThrustCsv('0.02,5\n1,0\n', 'm.csv');
    expect(issues[0]!.message).toContain("line 1: the curve starts at 0.02 s; it must start at t = 0");
  });

  it('rejects fewer than 2 rows and more than 100,000', () => {
    expect(parseThrustCsv('time,thrust\n0,5\n', 'm.csv').issues[0]!.message).toBe("'m.csv': 1 row; a thrust curve needs at least 2");
    expect(parseThrustCsv('', 'm.csv').issues[0]!.message).toBe("'m.csv': 0 rows; a thrust curve needs at least 2");
    const rows = (n: number) => Array.from({ length: n }, (_, i) => `${i / 1000},5`).join('\n');
    expect(parseThrustCsv(rows(MAX_THRUST_ROWS), 'm.csv').issues).toEqual([]);
    expect(parseThrustCsv(rows(MAX_THRUST_ROWS + 1), 'm.csv').issues[0]!.message).toBe("'m.csv' has more than the 100000 rows allowed");
  });

  it('lists the first ten bad rows and counts the rest', () => {
    const text = ['0,0', ...Array.from({ length: 25 }, () => 'x,y'), '1,0'].join('\n');
    const { issues } = parseThrustCsv(text, 'm.csv');
    expect(issues).toHaveLength(11);
    expect(issues[10]!.message).toBe('and 15 more row problems like these');
  });
});

describe('inline thrust curves', () => {
  it('accepts a valid curve', () => {
    expect(thrustCurveFromRows([[0, 0], [0.2, 50], [0.9, 0]])).toEqual({ curve: { time: [0, 0.2, 0.9], thrust: [0, 50, 0] }, issues: [] });
  });

  it('reports equal times as not increasing, at the row', () => {
    expect(thrustCurveFromRows([[0, 0], [0.2, 50], [0.2, 40], [1, 0]]).issues).toEqual([
      { path: 'vehicle.motor.thrust[2]', message: "time 0.2 s is not after the previous row's 0.2 s; times must strictly increase" },
    ]);
  });
});

describe('loading a curve by path', () => {
  it('resolves a relative path against the scenario folder and reads it through the injected reader', () => {
    const seen: string[] = [];
    const result = loadThrustCurve('curves/m.csv', {
      baseDir: '/data/scenarios/',
      readText: (p) => {
        seen.push(p);
        return '0,0\n1,10\n2,0';
      },
    });
    expect(seen).toEqual(['/data/scenarios/curves/m.csv']);
    expect(result).toEqual({ source: 'curves/m.csv', curve: { time: [0, 1, 2], thrust: [0, 10, 0] }, issues: [] });
  });

  it('reports a reader failure with the path it tried', () => {
    const result = loadThrustCurve('m.csv', { baseDir: 'scen', readText: () => { throw new Error('ENOENT: no such file'); } });
    expect(result.issues).toEqual([{ path: 'vehicle.motor.thrust', message: "cannot read 'm.csv' (looked for scen/m.csv): ENOENT: no such file" }]);
  });

  it('keeps absolute paths and URLs as written', () => {
    expect(resolveRelativePath('/a', '/b/c.csv')).toBe('/b/c.csv');
    expect(resolveRelativePath('/a', 'C:\\m.csv')).toBe('C:\\m.csv');
    expect(resolveRelativePath('https://x.org/s', 'https://y.org/m.csv')).toBe('https://y.org/m.csv');
    expect(resolveRelativePath(undefined, 'm.csv')).toBe('m.csv');
    expect(resolveRelativePath('https://x.org/s/', 'm.csv')).toBe('https://x.org/s/m.csv');
  });

  it('rejects something that is neither a list nor a path', () => {
    expect(loadThrustCurve(42).issues[0]!.message).toContain('42; expected a list of [time s, thrust N] rows or the path of a CSV file');
    expect(loadThrustCurve(undefined).issues[0]!.message).toContain('missing');
  });
});
