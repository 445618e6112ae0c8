@echo off
rem Outstage launcher for Windows with a JDK 17+ and Maven: the same as tools/outstage.
rem   tools\outstage.cmd               workbench on the bundled sample session
rem   tools\outstage.cmd COMMAND ...   any command (analyze, sweep, model, fit, session, verify, ...); see --help
setlocal EnableDelayedExpansion
set "HERE=%~dp0.."
for %%I in ("%HERE%") do set "HERE=%%~fI"
set "JAR=%HERE%\target\outstage-0.1.0-SNAPSHOT-all.jar"
set "BUILD="
if not exist "%JAR%" set "BUILD=1"
if not defined BUILD (
  rem rebuild when any source or the pom is newer than the jar
  for /f "delims=" %%F in ('powershell -NoProfile -Command "$j=(Get-Item '%JAR%').LastWriteTime; @(Get-ChildItem -Recurse -File '%HERE%\src\main'; Get-Item '%HERE%\pom.xml') | Where-Object { $_.LastWriteTime -gt $j } | Select-Object -First 1 | ForEach-Object { $_.FullName }"') do set "BUILD=1"
)
if defined BUILD (
  echo outstage: building the application jar ^(mvn -q -DskipTests package^)... 1>&2
  pushd "%HERE%"
  call mvn -B -q -DskipTests package 1>&2
  popd
  rem the class-data archives belong to the old jar
  if exist "%HERE%\target\cds" del /q "%HERE%\target\cds\*-win.jsa" 2>nul
)
set "OUTSTAGE_HOME=%HERE%"
set "JVM=-Djavafx.cachedir=%TEMP%\outstage-openjfx"
set "MODE=cli"
if "%~1"=="" set "MODE=gui"
if /i "%~1"=="gui" set "MODE=gui"
rem command-line runs: the client compiler alone starts sooner and wins up to a few hundred MB of captures
rem (see tools/outstage); live and watch run long and keep both compilers
set "C1=-XX:TieredStopAtLevel=1"
if /i "%~1"=="live" set "C1="
if /i "%~1"=="watch" set "C1="
if "%MODE%"=="cli" set "JVM=%JVM% %C1%"
rem the workbench gets the client compiler alone on a machine of at most two cores (see tools/outstage)
if "%MODE%"=="gui" if %NUMBER_OF_PROCESSORS% LEQ 2 set "JVM=%JVM% -XX:TieredStopAtLevel=1"
rem our classes and the FFT library compiled early, at 1/20 of the usual thresholds (see tools/launch-options.bash); quiet first,
rem or the JVM prints each command on stdout
set "JVM=%JVM% -XX:CompileCommand=quiet -XX:CompileCommand=CompileThresholdScaling,org.outstage.*::*,0.05 -XX:CompileCommand=CompileThresholdScaling,org.jtransforms.*::*,0.05"
set "CDS=%HERE%\target\cds"
set "ARCHIVE=%CDS%\outstage-%MODE%-win.jsa"
if /i "%OUTSTAGE_CDS%"=="off" goto run
if not exist "%CDS%" mkdir "%CDS%"
if exist "%ARCHIVE%" (
  set "JVM=%JVM% -Xlog:cds=off -Xlog:cds+dynamic=off -XX:SharedArchiveFile=%ARCHIVE%"
) else (
  set "JVM=%JVM% -Xlog:cds=off -Xlog:cds+dynamic=off -XX:ArchiveClassesAtExit=%ARCHIVE%"
)
:run
java %JVM% %OUTSTAGE_JAVA_OPTS% -jar "%JAR%" %*
exit /b %ERRORLEVEL%
