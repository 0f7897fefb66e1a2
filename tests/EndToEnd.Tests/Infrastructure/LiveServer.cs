using System.Collections.Concurrent;
using System.Diagnostics;
using System.Text.RegularExpressions;

namespace Patchproof.EndToEnd.Tests.Infrastructure;

/// <summary>The server as users run it, published in Release, in its own process on a free loopback port.</summary>
/// <remarks>
/// The project file publishes the server into <c>published-server/</c> beside the tests after each build (see
/// Patchproof.EndToEnd.Tests.csproj), so the browser loads the trimmed, precompressed client that
/// <c>dotnet run -c Release --project src/Server</c> serves, not the untrimmed build output. Each run gets a fresh
/// data folder, seeded with the demo scenario on start. <c>PATCHPROOF_E2E_SERVER</c> names another server assembly
/// to test, for example a build output, to compare figures.
/// </remarks>
public sealed partial class LiveServer : IAsyncLifetime
{
    private static readonly TimeSpan StartTimeout = TimeSpan.FromMinutes(3);
    private static readonly TimeSpan WarmUpTimeout = TimeSpan.FromMinutes(1);

    private readonly string dataFolder = Path.Combine(Path.GetTempPath(), "patchproof-e2e-" + Guid.NewGuid().ToString("N"));
    private readonly ConcurrentQueue<string> output = new();
    private Process? process;
    private TaskCompletionSource<long?> warmedUp = new();

    /// <summary>The server's address, for example <c>http://127.0.0.1:41234/</c>.</summary>
    public Uri BaseAddress { get; private set; } = new("http://127.0.0.1/");

    /// <summary>The server assembly started: <c>PATCHPROOF_E2E_SERVER</c>, else the one published beside the tests.</summary>
    public static string ServerAssembly { get; } = Environment.GetEnvironmentVariable("PATCHPROOF_E2E_SERVER") is { Length: > 0 } path
        ? Path.GetFullPath(path)
        : Path.Combine(AppContext.BaseDirectory, "published-server", "Patchproof.Server.dll");

    public async ValueTask InitializeAsync()
    {
        if (!File.Exists(ServerAssembly))
        {
            throw new InvalidOperationException($"No server at {ServerAssembly}: building Patchproof.EndToEnd.Tests publishes it there.");
        }

        var start = new ProcessStartInfo(Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } host ? host : "dotnet")
        {
            // The content root is the working folder: the published wwwroot and appsettings.json live there.
            WorkingDirectory = Path.GetDirectoryName(ServerAssembly)!,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var argument in new[] { "exec", ServerAssembly, "--urls", "http://127.0.0.1:0" })
        {
            start.ArgumentList.Add(argument);
        }

        start.Environment["ASPNETCORE_ENVIRONMENT"] = "Production";
        start.Environment["Patchproof__DataFolder"] = dataFolder;

        var listening = new TaskCompletionSource<Uri>(TaskCreationOptions.RunContinuationsAsynchronously);
        warmedUp = new TaskCompletionSource<long?>(TaskCreationOptions.RunContinuationsAsynchronously);
        process = new Process { StartInfo = start, EnableRaisingEvents = true };
        process.OutputDataReceived += (_, e) => OnOutput(e.Data, listening);
        process.ErrorDataReceived += (_, e) => OnOutput(e.Data, listening);
        process.Exited += (_, _) => listening.TrySetException(new InvalidOperationException(
            $"The server stopped before listening (exit code {process.ExitCode}):\n{string.Join('\n', output)}"));
        process.Start();
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();

        try
        {
            BaseAddress = await listening.Task.WaitAsync(StartTimeout);
        }
        catch (TimeoutException)
        {
            throw new InvalidOperationException($"The server did not listen within {StartTimeout}:\n{string.Join('\n', output)}");
        }

        // A lab's server renders its start page once as it starts (StartPageWarmUp); the tests measure the pages of a
        // server that has, and record what the warm-up took. A warm-up that never reports only costs the wait.
        try
        {
            if (await warmedUp.Task.WaitAsync(WarmUpTimeout) is { } warmUpMs)
            {
                await Timings.RecordAsync("server-start-page-warm-up-ms", warmUpMs);
            }
        }
        catch (TimeoutException)
        {
        }
    }

    public async ValueTask DisposeAsync()
    {
        if (process is not null)
        {
            if (!process.HasExited)
            {
                process.Kill(entireProcessTree: true);
                await process.WaitForExitAsync();
            }

            process.Dispose();
        }

        if (Directory.Exists(dataFolder))
        {
            Directory.Delete(dataFolder, recursive: true);
        }
    }

    private void OnOutput(string? line, TaskCompletionSource<Uri> listening)
    {
        if (line is null)
        {
            return;
        }

        output.Enqueue(line);
        if (ListeningLine().Match(line) is { Success: true } match)
        {
            listening.TrySetResult(new Uri(match.Groups[1].Value.TrimEnd('/') + "/"));
        }
        else if (WarmUpLine().Match(line) is { Success: true } warm)
        {
            warmedUp.TrySetResult(warm.Groups[1].Success ? long.Parse(warm.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture) : null);
        }
    }

    [GeneratedRegex(@"Now listening on: (http://\S+)")]
    private static partial Regex ListeningLine();

    [GeneratedRegex(@"Start page warm-up(?:: rendered in ([0-9]+) ms| failed)")]
    private static partial Regex WarmUpLine();
}
