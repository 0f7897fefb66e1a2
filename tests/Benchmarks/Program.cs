using BenchmarkDotNet.Running;

// Run with: dotnet run -c Release --project tests/Benchmarks -- --filter '*'
if (args.Length > 0 && args[0] == "captures-peak-memory")
{
    return Patchproof.Benchmarks.Captures.CapturePeakMemory.Run(args[1..]);
}

BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
return 0;
