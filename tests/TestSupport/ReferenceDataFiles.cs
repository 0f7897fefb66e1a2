namespace Patchproof.TestSupport;

/// <summary>Finds the published reference files in <c>tests/ReferenceData</c> from any test's output folder.</summary>
internal static class ReferenceDataFiles
{
    /// <summary>The repository's root folder, found by walking up to <c>Patchproof.slnx</c>.</summary>
    public static string RepositoryRoot { get; } = FindRepositoryRoot();

    /// <summary>The full path of a reference file, for example <c>PathOf("nist-strd/Misra1a.dat")</c>.</summary>
    public static string PathOf(string relativePath)
    {
        var path = Path.Combine(RepositoryRoot, "tests", "ReferenceData", relativePath);
        return File.Exists(path) ? path : throw new FileNotFoundException($"Reference file {relativePath} is missing from tests/ReferenceData.", path);
    }

    private static string FindRepositoryRoot()
    {
        for (var directory = new DirectoryInfo(AppContext.BaseDirectory); directory is not null; directory = directory.Parent)
        {
            if (File.Exists(Path.Combine(directory.FullName, "Patchproof.slnx")))
            {
                return directory.FullName;
            }
        }

        throw new DirectoryNotFoundException("Could not find Patchproof.slnx above " + AppContext.BaseDirectory);
    }
}
