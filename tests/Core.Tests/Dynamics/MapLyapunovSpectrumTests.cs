using Patchproof.Core.Dynamics;

namespace Patchproof.Core.Tests.Dynamics;

public sealed class MapLyapunovSpectrumTests
{
    [Fact]
    public void Compute_Henon_MatchesSprottAndSumsToLnB()
    {
        // Sprott, Common Chaotic Systems: Henon (1.4, 0.3) exponents 0.41922, -1.62319,
        // D_KY 1.25827; tolerance lambda_1 +- 0.005 for N >= 1e5 (CHECKS.md).
        // The sum is ln|det J| = ln 0.3 exactly (derived), to 1e-9.
        var spectrum = MapLyapunovSpectrum.Compute(new HenonMap(1.4, 0.3), [0.1, 0.1], iterations: 200_000);

        Assert.Equal(0.41922, spectrum.Exponents[0], 0.005);
        Assert.Equal(-1.62319, spectrum.Exponents[1], 0.005);
        Assert.Equal(Math.Log(0.3), spectrum.Sum(), 1e-9);
        Assert.Equal(1.25827, spectrum.KaplanYorkeDimension, 0.01);
    }

    [Fact]
    public void KaplanYorke_SprottLorenzExponents_Is2Point06215()
    {
        // Sprott: Lorenz exponents 0.9056, 0, -14.5723 give D_KY = 2.06215 (+- 0.003).
        Assert.Equal(2.06215, LyapunovSpectrum.KaplanYorke([0.9056, 0, -14.5723]), 0.003);
    }

    [Fact]
    public void KaplanYorke_StableAndVolumePreserving_AreTheEdgeCases()
    {
        Assert.Equal(0.0, LyapunovSpectrum.KaplanYorke([-0.1, -1]));
        Assert.Equal(2.0, LyapunovSpectrum.KaplanYorke([0.5, -0.5]));
    }
}
