using System.Globalization;
using BenchmarkDotNet.Attributes;
using CsvHelper;
using Patchproof.Core.Captures;

namespace Patchproof.Benchmarks.Captures;

/// <summary>Reads the 1,000,000-row, 3-channel capture of shared/BENCHMARKS.md section 2 (about 53 MB).</summary>
/// <remarks>
/// Compare with pandas.read_csv (C engine) at 173 MB/s and numpy.loadtxt at 195 MB/s on this kind of machine; the
/// target is at least 200 MB/s with exact parsing. MB/s = file bytes / mean time. The raw byte read is the floor;
/// the CsvHelper row is the same numeric body read through CsvHelper with double.Parse, for comparison.
/// </remarks>
[MemoryDiagnoser]
public class CaptureReaderBenchmarks
{
    private string path = string.Empty;

    [Params(1_000_000)]
    public int Rows { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        path = BenchmarkCaptureFile.Write(Path.Combine(Path.GetTempPath(), "patchproof-bench"), Rows);
        Console.WriteLine($"// capture file: {path}, {new FileInfo(path).Length} bytes");
    }

    [Benchmark(Baseline = true, Description = "raw byte read (floor)")]
    public long RawRead()
    {
        var buffer = new byte[1 << 20];
        long total = 0;
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
        int read;
        while ((read = stream.Read(buffer, 0, buffer.Length)) > 0)
        {
            total += read;
        }

        return total;
    }

    [Benchmark(Description = "CaptureReader.ReadFile (exact)")]
    public int ReadCapture()
    {
        var result = CaptureReader.ReadFile(path);
        return result.Value.SampleCount;
    }

    [Benchmark(Description = "CsvHelper body + double.Parse")]
    public int CsvHelperBody()
    {
        var options = new CsvReaderOptions { Separator = ',', HasHeader = false };
        using var reader = CsvReader.FromFile(path, options);
        var rows = 0;
        double sum = 0;
        var skip = 4;
        while (reader.Read())
        {
            if (skip > 0)
            {
                skip--;
                continue;
            }

            for (var k = 0; k < 4; k++)
            {
                sum += double.Parse(reader.GetSpan(k), NumberStyles.Float, CultureInfo.InvariantCulture);
            }

            rows++;
        }

        return sum > double.MaxValue ? -1 : rows;
    }
}
