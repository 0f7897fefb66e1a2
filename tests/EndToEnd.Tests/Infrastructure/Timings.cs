namespace Patchproof.EndToEnd.Tests.Infrastructure;

/// <summary>Records measured times in <c>artifacts/e2e/timings.tsv</c> for docs/performance.md; never asserted.</summary>
public static class Timings
{
    /// <summary>Appends one figure with the time of day and the machine's load average.</summary>
    public static Task RecordAsync(string name, double milliseconds) =>
        File.AppendAllTextAsync(Path.Combine(Browser.ArtifactsFolder, "timings.tsv"),
            $"{name}\t{milliseconds:0}\t{DateTimeOffset.UtcNow:u}\tload {LoadAverage()}\n", TestContext.Current.CancellationToken);

    private static string LoadAverage() =>
        File.Exists("/proc/loadavg") ? string.Join(' ', File.ReadAllText("/proc/loadavg").Split(' ').Take(3)) : "unknown";
}
