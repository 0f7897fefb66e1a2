namespace Patchproof.TestSupport;

/// <summary>Standard normal draws from a seeded generator (Box-Muller), for reproducible synthetic captures.</summary>
internal static class GaussianNoise
{
    public static double Next(Random random)
    {
        var u1 = 1.0 - random.NextDouble();
        var u2 = random.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}
