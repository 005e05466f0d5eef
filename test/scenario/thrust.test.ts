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

// Pound-force is defined as 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N exactly
// (NIST SP 811, 2008, appendix B.8); a millisecond is 0.001 s and a kilonewton 1000 N (SI brochure).
const LBF = 4.4482216152605;

describe('thrust-curve units in the CSV header', () => {
  it('reads pound-force thrust from every header spelling, in any letter case', () => {
    const expected = { time: [0, 0.5, 1], thrust: [0, 100 * LBF, 0] };
    for (const header of ['time_s,thrust_lbf', 'Time (s),Thrust (lbf)', 'time [s];thrust [LBF]', 'TIME_S\tTHRUST_LBF', 'Time (s)  Thrust (lbf)']) {
      const result = parseThrustCsv(`${header}\n0,0\n0.5,100\n1,0\n`.replace(/,/g, header.includes(';') ? ';' : ','), 'm.csv');
      expect(result, header).toEqual({ curve: expected, issues: [] });
    }
  });

  it('reads milliseconds and kilonewtons', () => {
    expect(parseThrustCsv('Time (ms),Thrust [kN]\n0,0\n250,1.5\n500,0\n', 'm.csv').curve).toEqual({ time: [0, 0.25, 0.5], thrust: [0, 1500, 0] });
  });

  it('reads a header without units as seconds and newtons', () => {
    expect(parseThrustCsv('time,thrust\n0,0\n1,10\n2,0', 'm.csv').curve).toEqual({ time: [0, 1, 2], thrust: [0, 10, 0] });
  });

  it('refuses a header unit it does not understand, naming the file and the line', () => {
    const { curve, issues } = parseThrustCsv('# stand test\ntime_s,thrust_kgf\n0,0\n1,10\n2,0', 'm.csv');
    expect(curve).toBeUndefined();
    expect(issues).toHaveLength(1);
    expect(issues[0]!.message).toMatch(/^'m\.csv' line 2: header 'time_s,thrust_kgf': the thrust unit 'kgf' is not understood; expected one of N, kN, lbf/);
    expect(parseThrustCsv('t (min),F (N)\n0,0\n1,0', 'm.csv').issues[0]!.message).toContain("the time unit 'min' is not understood");
    expect(parseThrustCsv('time_s,thrust_lb\n0,0\n1,1', 'm.csv').issues[0]!.message).toContain("write 'lbf'");
    expect(parseThrustCsv('thrust_N,time_s\n0,0\n1,1', 'm.csv').issues[0]!.message).toContain('swap the columns');
  });
});

describe('inline thrust rows with units and inline CSV text', () => {
  it('reads unit strings in inline rows, mixed with plain SI numbers', () => {
    const result = thrustCurveFromRows([['0 s', '0 lbf'], ['50 ms', '94 lbf'], [1.2, 0]]);
    expect(result.issues).toEqual([]);
    expect(result.curve!.time).toEqual([0, 0.05, 1.2]);
    expect(result.curve!.thrust).toEqual([0, 94 * LBF, 0]);
  });

  it('names the cell of a unit of the wrong kind', () => {
    expect(thrustCurveFromRows([[0, 0], ['1 s', '3 kg'], [2, 0]]).issues).toEqual([
      { path: 'vehicle.motor.thrust[1][1]', message: "thrust: '3 kg' has a unit of mass; expected a force (N, kN, lbf)" },
    ]);
  });

  it('reads a thrust string with line breaks as CSV text, not as a file name', () => {
    const result = loadThrustCurve('time_s,thrust_lbf\n0,0\n0.5,20\n1,0', {
      readText: () => {
        throw new Error('must not be read as a path');
      },
    });
    expect(result).toEqual({ source: 'inline', curve: { time: [0, 0.5, 1], thrust: [0, 20 * LBF, 0] }, issues: [] });
    expect(loadThrustCurve('0,0\n0.5,x\n1,0').issues[0]!.message).toBe("'inline CSV text' line 2: '0.5,x' is not two numbers (time s, thrust N)");
  });

  it('refuses rows pasted on one line instead of taking them for a path', () => {
    const { issues } = loadThrustCurve('0,0; 0.1,120; 1,0', { readText: () => '0,0\n1,1' });
    expect(issues[0]!.message).toContain('looks like thrust rows written on one line');
    // A real file name that starts with a digit is still a path.
    expect(loadThrustCurve('2024 motor.csv', { readText: () => '0,0\n1,1' }).issues).toEqual([]);
  });
});

describe('every number in a thrust curve is finite and in range', () => {
  it('refuses 1e400 with the file and line', () => {
    const { issues } = parseThrustCsv('0,0\n0.1,1e400\n1,0', 'm.csv');
    expect(issues).toEqual([{ path: 'vehicle.motor.thrust', message: "'m.csv' line 2: '0.1,1e400': thrust '1e400' is too large to be a finite number" }]);
  });

  it('refuses a 50-MB number, showing at most the first 60 characters of the line', () => {
    const huge = '9'.repeat(50 * 1024 * 1024);
    const { issues } = parseThrustCsv(`0,0\n0.1,${huge}\n1,0`, 'big.csv');
    expect(issues).toHaveLength(1);
    expect(issues[0]!.message.startsWith("'big.csv' line 2: '0.1,9999")).toBe(true);
    expect(issues[0]!.message.length).toBeLessThan(200);
  });

  it('refuses an absurd but finite thrust or time, inline and in a file', () => {
    expect(parseThrustCsv('0,0\n1,1e300\n2,0', 'm.csv').issues[0]!.message).toContain('line 2');
    expect(parseThrustCsv('0,0\n1e9,10', 'm.csv').issues[0]!.message).toContain('time 1000000000 s is out of range');
    expect(thrustCurveFromRows([[0, 0], [1, 1e300], [2, 0]]).issues[0]!.path).toBe('vehicle.motor.thrust[1]');
  });
});
