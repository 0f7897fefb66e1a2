using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Diagnosers;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;

namespace Patchproof.Benchmarks.Simulation;

/// <summary>A short job run inside the host process: on the shared build machine the generated project's build times out.</summary>
public sealed class ShortInProcessConfig : ManualConfig
{
    public ShortInProcessConfig()
    {
        AddJob(Job.Default
            .WithToolchain(InProcessEmitToolchain.Instance)
            .WithLaunchCount(1)
            .WithWarmupCount(3)
            .WithIterationCount(15));
        AddDiagnoser(MemoryDiagnoser.Default);
    }
}
