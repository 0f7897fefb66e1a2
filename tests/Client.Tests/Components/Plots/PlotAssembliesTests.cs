using Patchproof.Client.Components.Plots;

namespace Patchproof.Client.Tests.Components.Plots;

public sealed class PlotAssembliesTests
{
    [Theory]
    [InlineData("fits/7d3f0c1e-0000-4000-8000-000000000001/report")]
    [InlineData("/fits/7d3f0c1e-0000-4000-8000-000000000001/report/")]
    [InlineData("fits/7d3f0c1e-0000-4000-8000-000000000001/report?tab=spectra")]
    public void AreNeededFor_TheFitReport_IsTrue(string path) => Assert.True(PlotAssemblies.AreNeededFor(path));

    [Theory]
    [InlineData("")]
    [InlineData("fits/7d3f0c1e-0000-4000-8000-000000000001")]
    [InlineData("benches/7d3f0c1e-0000-4000-8000-000000000001")]
    [InlineData("how-to/capture")]
    [InlineData("fits/7d3f0c1e-0000-4000-8000-000000000001/report/extra")]
    public void AreNeededFor_PagesWithoutPlots_IsFalse(string path) => Assert.False(PlotAssemblies.AreNeededFor(path));

    [Fact]
    public void Files_NameTheChartLibraryTheProjectMarksForLazyLoading()
    {
        var project = File.ReadAllText(Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "src", "Client", "Patchproof.Client.csproj"));

        Assert.All(PlotAssemblies.Files, file => Assert.Contains($"<BlazorWebAssemblyLazyLoad Include=\"{file}\" />", project, StringComparison.Ordinal));
        Assert.Contains(typeof(Plotly.Blazor.PlotlyChart).Assembly.GetName().Name + ".wasm", PlotAssemblies.Files);
    }
}
