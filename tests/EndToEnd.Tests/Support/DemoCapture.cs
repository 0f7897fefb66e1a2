namespace Patchproof.EndToEnd.Tests.Support;

/// <summary>The demo captures of the invented scenario's boards (sample-captures/, demo data only).</summary>
public static class DemoCapture
{
    /// <summary>The path of a demo capture in <c>sample-captures/</c>.</summary>
    public static string OfBoard(string fileName) => Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "sample-captures", fileName);
}
