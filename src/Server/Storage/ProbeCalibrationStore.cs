using Microsoft.Extensions.Options;
using Patchproof.Core.Captures.Calibration;

namespace Patchproof.Server.Storage;

/// <summary>Probe calibration files per bench, in the data folder; the newest one is what fits of that bench's boards use.</summary>
/// <remarks>
/// Layout: <c>calibrations/{bench}/{uploaded unix ms, 15 digits}-{random}.json</c>, each file exactly as uploaded (after it
/// was read and checked). Files are written under <c>tmp/</c> and moved into place when complete, so a reader never sees a
/// half-written one. "Newest" is by the server's upload time, not by the time written inside the file. No database row is
/// needed: any server process sharing the data folder sees the same files.
/// </remarks>
internal sealed class ProbeCalibrationStore(IOptions<PatchproofOptions> options, TimeProvider time)
{
    private string Root => Path.Combine(options.Value.DataFolderPath, "calibrations");

    /// <summary>Stores an uploaded, already checked calibration file for the bench; returns when it was stored.</summary>
    public DateTimeOffset Save(Guid benchId, string document)
    {
        var uploaded = time.GetUtcNow();
        var folder = Path.Combine(Root, benchId.ToString("N"));
        Directory.CreateDirectory(folder);
        var temp = Path.Combine(options.Value.DataFolderPath, "tmp");
        Directory.CreateDirectory(temp);
        var tempPath = Path.Combine(temp, $"{Guid.NewGuid():N}.calibration");
        File.WriteAllText(tempPath, document);
        File.Move(tempPath, Path.Combine(folder, $"{uploaded.ToUnixTimeMilliseconds():D15}-{Guid.NewGuid():N}.json"));
        return uploaded;
    }

    /// <summary>A fresh path in the data folder's temporary area, for an uploaded calibration capture while it is read.</summary>
    public string NewTempPath()
    {
        var temp = Path.Combine(options.Value.DataFolderPath, "tmp");
        Directory.CreateDirectory(temp);
        return Path.Combine(temp, $"{Guid.NewGuid():N}.calibration-capture");
    }

    /// <summary>The bench's newest calibration as stored and read, or null when it has none.</summary>
    public (ProbeCalibration Calibration, string Document, DateTimeOffset UploadedAt)? Newest(Guid benchId) =>
        Stored(benchId).Select(entry => ((ProbeCalibration, string, DateTimeOffset)?)entry).FirstOrDefault();

    /// <summary>Every readable calibration of the bench, newest upload first.</summary>
    public IReadOnlyList<(ProbeCalibration Calibration, string Document, DateTimeOffset UploadedAt)> All(Guid benchId) => Stored(benchId).ToList();

    private IEnumerable<(ProbeCalibration Calibration, string Document, DateTimeOffset UploadedAt)> Stored(Guid benchId)
    {
        var folder = Path.Combine(Root, benchId.ToString("N"));
        if (!Directory.Exists(folder))
        {
            yield break;
        }

        foreach (var path in Directory.GetFiles(folder, "*.json").OrderDescending(StringComparer.Ordinal))
        {
            var read = ProbeCalibrationFile.ReadFile(path);
            if (read.TryGetValue(out var calibration) && long.TryParse(Path.GetFileName(path).AsSpan(0, 15), out var unixMs))
            {
                yield return (calibration, File.ReadAllText(path), DateTimeOffset.FromUnixTimeMilliseconds(unixMs));
            }
        }
    }
}
