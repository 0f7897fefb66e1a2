using System.Diagnostics;
using Patchproof.Core.Captures;

namespace Patchproof.Benchmarks.Captures;

/// <summary>A console run that streams a large capture and reports time and peak working set (BenchmarkDotNet does not measure peak memory).</summary>
/// <remarks>Run: <c>dotnet run -c Release --project tests/Benchmarks -- captures-peak-memory 10000000</c>. The file is written to a temporary folder first.</remarks>
internal static class CapturePeakMemory
{
    public static int Run(string[] args)
    {
        var rows = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 10_000_000;
        var path = BenchmarkCaptureFile.Write(Path.Combine(Path.GetTempPath(), "patchproof-bench"), rows);
        var bytes = new FileInfo(path).Length;
        GC.Collect();
        using var process = Process.GetCurrentProcess();
        process.Refresh();
        var before = process.PeakWorkingSet64;
        var watch = Stopwatch.StartNew();
        var result = CaptureReader.ReadFile(path);
        watch.Stop();
        process.Refresh();
        var capture = result.Value;
        var sampleBytes = (long)capture.SampleCount * capture.Channels.Count * sizeof(float);
        Console.WriteLine($"rows {capture.SampleCount:N0}, file {bytes / 1e6:F1} MB, read in {watch.Elapsed.TotalSeconds:F3} s ({bytes / 1e6 / watch.Elapsed.TotalSeconds:F0} MB/s)");
        Console.WriteLine($"time base {capture.TimeBase.GetType().Name}, interval {capture.TimeBase.TypicalIntervalSeconds:G6} s");
        Console.WriteLine($"parsed samples {sampleBytes / 1e6:F1} MB (float32), peak working set {process.PeakWorkingSet64 / 1e6:F1} MB (before reading {before / 1e6:F1} MB), managed heap now {GC.GetTotalMemory(false) / 1e6:F1} MB");
        foreach (var note in result.Warnings)
        {
            Console.WriteLine("  " + note);
        }

        GC.KeepAlive(capture);
        return 0;
    }
}
