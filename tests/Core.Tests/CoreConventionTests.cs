using System.Reflection;
using Patchproof.Core;

namespace Patchproof.Core.Tests;

/// <summary>Conventions every public Core type keeps, checked by reflection.</summary>
public sealed class CoreConventionTests
{
    private static readonly Assembly Core = typeof(CoreAssembly).Assembly;

    [Fact]
    public void PublicTypes_HaveNoPublicSetters()
    {
        // Arrange
        var publicTypes = Core.GetExportedTypes();

        // Act: a public setter that is not init-only makes a type mutable from outside.
        var offenders = publicTypes
            .SelectMany(type => type.GetProperties(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly)
                .Where(property => property.SetMethod is { IsPublic: true } setter && !IsInitOnly(setter))
                .Select(property => $"{type.FullName}.{property.Name}"))
            .ToList();

        // Assert
        Assert.Empty(offenders);
    }

    [Fact]
    public void PublicTypes_HaveNoPublicMutableFields()
    {
        var offenders = Core.GetExportedTypes()
            .SelectMany(type => type.GetFields(BindingFlags.Public | BindingFlags.Instance | BindingFlags.Static | BindingFlags.DeclaredOnly)
                .Where(field => !field.IsInitOnly && !field.IsLiteral && !type.IsEnum)
                .Select(field => $"{type.FullName}.{field.Name}"))
            .ToList();

        Assert.Empty(offenders);
    }

    [Fact]
    public void Types_HaveNoStaticMutableFields()
    {
        // Static mutable state is banned in Core: results must not depend on what ran before.
        var offenders = Core.GetTypes()
            .Where(type => !type.IsDefined(typeof(System.Runtime.CompilerServices.CompilerGeneratedAttribute)))
            .SelectMany(type => type.GetFields(BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.Static | BindingFlags.DeclaredOnly)
                .Where(field => !field.IsInitOnly && !field.IsLiteral && !field.Name.Contains('<'))
                .Select(field => $"{type.FullName}.{field.Name}"))
            .ToList();

        Assert.Empty(offenders);
    }

    [Fact]
    public void CoreAssembly_References_NoWebOrDatabaseCode()
    {
        var forbidden = new[] { "Microsoft.AspNetCore", "Microsoft.EntityFrameworkCore", "Npgsql" };

        var references = Core.GetReferencedAssemblies().Select(name => name.Name ?? string.Empty);

        Assert.DoesNotContain(references, name => forbidden.Any(prefix => name.StartsWith(prefix, StringComparison.Ordinal)));
    }

    [Fact]
    public void Version_IsTheProjectVersion()
    {
        Assert.Matches(@"^\d+\.\d+\.\d+", CoreAssembly.Version);
    }

    private static bool IsInitOnly(MethodInfo setter) =>
        setter.ReturnParameter.GetRequiredCustomModifiers().Any(modifier => modifier.FullName == "System.Runtime.CompilerServices.IsExternalInit");
}
