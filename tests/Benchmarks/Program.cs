using BenchmarkDotNet.Running;

// Run with: dotnet run -c Release --project tests/Benchmarks -- --filter '*'
if (args.Length > 0 && args[0] == "captures-peak-memory")
{
    return Patchproof.Benchmarks.Captures.CapturePeakMemory.Run(args[1..]);
}

if (args.Length > 0 && args[0] == "comparison-timings")
{
    return Patchproof.Benchmarks.Reports.FitComparisonBenchmarks.PrintTimings(args.Length > 1 ? int.Parse(args[1], System.Globalization.CultureInfo.InvariantCulture) : 3);
}

if (args.Length > 0 && args[0] == "fit-timings")
{
    return Patchproof.Benchmarks.Estimation.WholeFitBenchmarks.PrintTimings(args.Length > 1 ? int.Parse(args[1], System.Globalization.CultureInfo.InvariantCulture) : 3);
}

if (args.Length > 0 && args[0] == "fit-accuracy")
{
    return Patchproof.Benchmarks.Estimation.FitAccuracyComparison.Print(args.Length > 1 ? int.Parse(args[1], System.Globalization.CultureInfo.InvariantCulture) : 10);
}

BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
return 0;
