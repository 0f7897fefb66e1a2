namespace Patchproof.Server;

/// <summary>The server's settings, bound from the <c>Patchproof</c> configuration section.</summary>
internal sealed class PatchproofOptions
{
    public const string SectionName = "Patchproof";

    /// <summary>Where the SQLite database and the capture files live; relative paths are taken from the app's folder.</summary>
    public string DataFolder { get; set; } = "data";

    /// <summary>Capture upload limits.</summary>
    public CaptureLimits Captures { get; set; } = new();

    /// <summary>How this process takes part in running fit jobs.</summary>
    public FitJobSettings Fits { get; set; } = new();

    /// <summary>The demo scenario loaded on first start.</summary>
    public DemoSettings Demo { get; set; } = new();

    /// <summary>The data folder as an absolute path.</summary>
    public string DataFolderPath => Path.GetFullPath(DataFolder, AppContext.BaseDirectory);
}

/// <summary>Limits on one capture upload.</summary>
internal sealed class CaptureLimits
{
    /// <summary>The largest file accepted, in bytes (default 1 GiB).</summary>
    public long MaxUploadBytes { get; set; } = 1L << 30;

    /// <summary>The most sample rows accepted in one capture (default 20 million).</summary>
    public long MaxRows { get; set; } = 20_000_000;
}

/// <summary>Settings of the fit job runner.</summary>
internal sealed class FitJobSettings
{
    /// <summary>How many jobs this process runs at once; 0 makes it serve the API only.</summary>
    public int Workers { get; set; } = 1;

    /// <summary>How long a claim on a job lasts without a heartbeat before another process may take it over.</summary>
    public TimeSpan LeaseDuration { get; set; } = TimeSpan.FromSeconds(30);

    /// <summary>How often a running job renews its lease, saves its progress and looks for a cancel request.</summary>
    public TimeSpan HeartbeatInterval { get; set; } = TimeSpan.FromSeconds(1);

    /// <summary>How often an idle worker looks for queued jobs that other processes created.</summary>
    public TimeSpan PollInterval { get; set; } = TimeSpan.FromSeconds(2);

    /// <summary>How many times a job may be taken before it is marked failed (a process stopped mid-fit each time).</summary>
    public int MaxAttempts { get; set; } = 3;
}

/// <summary>Settings of the demo scenario.</summary>
internal sealed class DemoSettings
{
    /// <summary>Load the demo bench and boards on start when they are not there yet.</summary>
    public bool Seed { get; set; } = true;

    /// <summary>The folder of demo design files; when null, the first <c>designs</c> folder found above the app's folder.</summary>
    public string? DesignsFolder { get; set; }

    /// <summary>The folder of demo captures; when null, the first <c>sample-captures</c> folder found above the app's folder.</summary>
    public string? CapturesFolder { get; set; }
}
