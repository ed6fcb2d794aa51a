/**
 * Logger exports: the formats Slakewise reads (each converted to seconds from the
 * first row and °C; °F by (F − 32)·5/9, the definition of the scale) and the files
 * it refuses, each with a message saying why.
 */
import { describe, expect, it } from 'vitest'
import { LogError, MAX_LOG_ROWS, previewLog, readLog, type LogMapping } from '../../../server/measurements/parseLog'

const utf8 = (text: string) => new TextEncoder().encode(text)

describe('reading a logger export', () => {
  it('comma-separated, seconds, °C', async () => {
    const file = utf8('Time (s),Probe centre (°C),Bath (°C)\n0,850.0,60.1\n0.5,848.2,60.3\n1.0,840.9,60.8\n')
    const preview = await previewLog(file)
    expect(preview).toMatchObject({ delimiter: ',', decimalComma: false, timeFormat: 'seconds', rows: 3 })
    expect(preview.columns).toEqual([
      { name: 'Time (s)', role: 'time', unit: null },
      { name: 'Probe centre (°C)', role: 'temperature', unit: 'C' },
      { name: 'Bath (°C)', role: 'temperature', unit: 'C' },
    ])
    const { series } = await readLog(file, { time: 'Time (s)', channels: [{ column: 'Probe centre (°C)', unit: 'C' }] })
    expect(series).toEqual({ t_s: [0, 0.5, 1], channels: [{ name: 'Probe centre (°C)', unit: 'C', T_C: [850, 848.2, 840.9] }] })
  })

  it('semicolons, decimal comma, hh:mm:ss.s clock times, °F', async () => {
    const file = utf8('Zeit;TC1 [°F]\r\n10:59:59,5;1562,0\r\n11:00:00,0;1472\r\n11:00:01,5;212,0\r\n')
    const preview = await previewLog(file)
    expect(preview).toMatchObject({ delimiter: ';', decimalComma: true, timeFormat: 'clock' })
    expect(preview.columns[1]).toEqual({ name: 'TC1 [°F]', role: 'temperature', unit: 'F' })
    const { series } = await readLog(file, { time: 'Zeit', channels: [{ column: 'TC1 [°F]', unit: 'F' }] })
    expect(series.t_s).toEqual([0, 0.5, 2])
    // 1562 °F = 850 °C, 1472 °F = 800 °C, 212 °F = 100 °C.
    series.channels[0].T_C.forEach((T, i) => expect(T).toBeCloseTo([850, 800, 100][i], 9))
  })

  it('tabs, date-times across midnight, a UTF-8 byte-order mark', async () => {
    const file = utf8('\uFEFFTimestamp\tLoad TC (C)\n2026-12-01 23:59:58\t900\n2026-12-02 00:00:03\t880\n')
    const preview = await previewLog(file)
    expect(preview).toMatchObject({ delimiter: '\t', timeFormat: 'date-time' })
    const { series } = await readLog(file, { time: 'Timestamp', channels: [{ column: 'Load TC (C)', unit: 'C' }] })
    expect(series.t_s).toEqual([0, 5])
  })

  it('gives the first row\'s date-time as written, without a zone, for the form to read in local time', async () => {
    expect((await previewLog(utf8('Timestamp,TC (C)\n2026-12-01 23:59:58.5,900\n2026-12-02 00:00:03,880\n'))).firstDateTime).toBe('2026-12-01T23:59:58.500')
    expect((await previewLog(utf8('Date;Core °C\n01.12.2026 08:00:00;850\n01.12.2026 08:00:10;700\n'))).firstDateTime).toBe('2026-12-01T08:00:00.000')
    expect((await previewLog(utf8('t (s),TC (C)\n0,900\n5,880\n'))).firstDateTime).toBeNull()
  })

  it('day-first date-times and UTF-16 with a byte-order mark', async () => {
    const text = 'Date;Core °C\n01.12.2026 08:00:00;850\n01.12.2026 08:00:10;700\n'
    const body = new Uint8Array(2 + text.length * 2)
    body.set([0xff, 0xfe])
    for (let i = 0; i < text.length; i++) {
      body[2 + 2 * i] = text.charCodeAt(i) & 0xff
      body[3 + 2 * i] = text.charCodeAt(i) >> 8
    }
    const { series } = await readLog(body, { time: 'Date', channels: [{ column: 'Core °C', unit: 'C' }] })
    expect(series).toEqual({ t_s: [0, 10], channels: [{ name: 'Core °C', unit: 'C', T_C: [850, 700] }] })
  })

  it('a header that does not say the unit leaves it for the person to confirm', async () => {
    const preview = await previewLog(utf8('t,ch1\n0,850\n1,800\n'))
    expect(preview.columns[1]).toEqual({ name: 'ch1', role: 'temperature', unit: null })
  })
})

const good: LogMapping = { time: 'Time (s)', channels: [{ column: 'TC (°C)', unit: 'C' }] }
const refusal = async (bytes: Uint8Array, mapping: LogMapping = good) => {
  try {
    await readLog(bytes, mapping)
  } catch (error) {
    expect(error).toBeInstanceOf(LogError)
    return (error as Error).message
  }
  throw new Error('the file was accepted')
}

describe('refusing a bad file', () => {
  it.each([
    ['an empty file', new Uint8Array(0), 'file: is empty'],
    ['a file of blank lines', utf8('\n\n  \n'), 'file: is empty'],
    ['a binary file', new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x14]), 'file: is not text (it holds NUL bytes); export the log as CSV or TSV'],
    ['an unknown encoding (Latin-1 degree sign)', new Uint8Array([...utf8('Time (s),TC ('), 0xb0, ...utf8('C)\n0,850\n')]), 'file: is in an unknown text encoding; save it as UTF-8'],
    ['a header alone', utf8('Time (s),TC (°C)\n'), 'file: has a header row but no data rows'],
    ['time going backwards', utf8('Time (s),TC (°C)\n0,850\n2,840\n1,830\n'), 'file: row 4, column "Time (s)": time goes backwards or repeats (1)'],
    ['text in a number column', utf8('Time (s),TC (°C)\n0,850\n1,open\n'), 'file: row 3, column "TC (°C)": "open" is not a number'],
    ['a formula-looking cell', utf8('Time (s),TC (°C)\n0,850\n1,=SUM(B1:B2)\n'), 'file: row 3, column "TC (°C)": "=SUM(B1:B2)" looks like a spreadsheet formula'],
    ['a time that changes format', utf8('Time (s),TC (°C)\n0,850\n00:00:01,840\n'), 'file: row 3, column "Time (s)": "00:00:01" is not a time like the first row\'s'],
    ['a ragged row', utf8('Time (s),TC (°C)\n0,850\n1,840,12\n'), 'file: is not readable CSV'],
  ])('%s', async (_, bytes, message) => {
    expect(await refusal(bytes)).toContain(message)
  })

  it('no numeric time column', async () => {
    await expect(previewLog(utf8('Label,TC (°C)\nstart,850\nend,800\n'))).rejects.toThrow('file: has no time column of seconds, hh:mm:ss or date-times in its first data row')
    expect(await refusal(utf8('Label,TC (°C)\nstart,850\nend,800\n'), { time: 'Label', channels: [{ column: 'TC (°C)', unit: 'C' }] })).toBe('mapping.time: "Label" does not hold seconds, hh:mm:ss or date-times')
  })

  it.each([
    ['a time column that is not there', { time: 'Seconds', channels: [{ column: 'TC (°C)', unit: 'C' }] }, 'mapping.time: the file has no column named "Seconds"'],
    ['a channel that is not there', { time: 'Time (s)', channels: [{ column: 'TC2', unit: 'C' }] }, 'mapping.channels.0.column: the file has no column named "TC2"'],
    ['the time column as a channel', { time: 'Time (s)', channels: [{ column: 'Time (s)', unit: 'C' }] }, 'mapping.channels.0.column: "Time (s)" is the time column'],
    ['no channel at all', { time: 'Time (s)', channels: [] }, 'mapping.channels: map at least one temperature column'],
  ] as [string, LogMapping, string][])('a mapping with %s', async (_, mapping, message) => {
    expect(await refusal(utf8('Time (s),TC (°C)\n0,850\n1,840\n'), mapping)).toBe(message)
  })

  it('a file over 10 MB, by its size alone', async () => {
    expect(await refusal(new Uint8Array(10 * 1024 * 1024 + 1).fill(0x31))).toBe('file: is 10.0 MB, over the 10 MB limit')
  })

  it('a file over 200,000 rows', async () => {
    const rows = Array.from({ length: MAX_LOG_ROWS + 1 }, (_, i) => `${i},800`).join('\n')
    expect(await refusal(utf8(`Time (s),TC (°C)\n${rows}\n`))).toBe('file: has more than the 200,000-row limit')
  }, 60_000)

  it('exactly 200,000 rows are read', async () => {
    const rows = Array.from({ length: MAX_LOG_ROWS }, (_, i) => `${i},800`).join('\n')
    const { series } = await readLog(utf8(`Time (s),TC (°C)\n${rows}\n`), good)
    expect(series.t_s).toHaveLength(MAX_LOG_ROWS)
  }, 60_000)
})
