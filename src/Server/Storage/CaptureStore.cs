using Microsoft.Extensions.Options;

namespace Patchproof.Server.Storage;

/// <summary>Capture files in the data folder, stored under the SHA-256 of their bytes.</summary>
/// <remarks>
/// Layout: <c>captures/ab/abcdef....csv</c> holds the file exactly as received, and
/// <c>captures/ab/abcdef....samples</c> the parsed samples beside it. New files are first written
/// under <c>tmp/</c> (same volume) and moved into place only after they are complete and checked, so
/// a failed upload leaves no half-written file where the store looks. A client's file name never
/// becomes a path.
/// </remarks>
internal sealed class CaptureStore(IOptions<PatchproofOptions> options)
{
    private string Root => Path.Combine(options.Value.DataFolderPath, "captures");

    private string TempRoot => Path.Combine(options.Value.DataFolderPath, "tmp");

    public string CsvPathOf(string sha256) => Path.Combine(FolderOf(sha256), sha256 + ".csv");

    public string SamplesPathOf(string sha256) => Path.Combine(FolderOf(sha256), sha256 + ".samples");

    /// <summary>A fresh path under the store's temporary folder.</summary>
    public string NewTempPath(string suffix)
    {
        Directory.CreateDirectory(TempRoot);
        return Path.Combine(TempRoot, $"{Guid.NewGuid():N}{suffix}");
    }

    /// <summary>Moves a finished temporary file into place; when the same content is already stored, drops the copy.</summary>
    public void Commit(string tempPath, string finalPath)
    {
        Directory.CreateDirectory(Path.GetDirectoryName(finalPath)!);
        if (File.Exists(finalPath))
        {
            DeleteQuietly(tempPath);
            return;
        }

        try
        {
            File.Move(tempPath, finalPath, overwrite: false);
        }
        catch (IOException) when (File.Exists(finalPath))
        {
            // Another upload of the same bytes won the race; its file is identical.
            DeleteQuietly(tempPath);
        }
    }

    /// <summary>Removes leftovers of uploads cut off by a stop of the process; only old ones, as other processes may share the folder.</summary>
    public void ClearStaleTemporaryFiles(TimeSpan olderThan)
    {
        if (!Directory.Exists(TempRoot))
        {
            return;
        }

        var cutoff = DateTime.UtcNow - olderThan;
        foreach (var file in Directory.EnumerateFiles(TempRoot).Where(f => File.GetLastWriteTimeUtc(f) < cutoff))
        {
            DeleteQuietly(file);
        }
    }

    /// <summary>How many files the store holds (for tests and diagnostics).</summary>
    public int CountStoredFiles() => Directory.Exists(Root) ? Directory.EnumerateFiles(Root, "*", SearchOption.AllDirectories).Count() : 0;

    public static void DeleteQuietly(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
        }
        catch (UnauthorizedAccessException)
        {
        }
    }

    private string FolderOf(string sha256)
    {
        if (sha256.Length != 64 || !sha256.All(char.IsAsciiHexDigitLower))
        {
            throw new ArgumentException("Expected a lower-case hex SHA-256.", nameof(sha256));
        }

        return Path.Combine(Root, sha256[..2]);
    }
}
