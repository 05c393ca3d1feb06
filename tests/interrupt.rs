//! SIGINT during a long batch: no output file or temporary file is left, and the message says how far it got.

use crate::support::{ebullio, scratch};

use std::io::Write;
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

/// Wait for the child with a deadline; kill it (and fail) if it hangs.
fn wait_with_deadline(
    child: &mut std::process::Child,
    limit: Duration,
) -> std::process::ExitStatus {
    let start = Instant::now();
    loop {
        if let Some(status) = child.try_wait().expect("try_wait") {
            return status;
        }
        if start.elapsed() > limit {
            let _ = child.kill();
            panic!("ebullio did not stop within {limit:?} of SIGINT");
        }
        std::thread::sleep(Duration::from_millis(20));
    }
}

#[test]
fn sigint_during_estimate_batch_leaves_no_output_and_reports_progress() {
    let dir = scratch();
    let input = dir.path().join("library.csv");
    {
        // Invented structures; enough rows that the batch is still running when the signal comes.
        let mut f = std::io::BufWriter::new(std::fs::File::create(&input).unwrap());
        writeln!(f, "smiles").unwrap();
        let pool = [
            "CCCCCCCCCCCCOC(=O)c1ccc(cc1)C(C)(C)C",
            "Oc1ccc(cc1)CCCCCCCCC(=O)OCC",
            "ClCCCCCCCCCCCCc1ccccc1",
            "CC(C)CC(=O)Nc1ccc(cc1)C#N",
        ];
        for i in 0..1_500_000usize {
            writeln!(f, "{}", pool[i % pool.len()]).unwrap();
        }
    }
    let output = dir.path().join("estimates.csv");
    let mut child = ebullio()
        .args(["estimate", "--input"])
        .arg(&input)
        .args(["--smiles-column", "smiles", "--format", "csv", "--output"])
        .arg(&output)
        .stdin(Stdio::null())
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    std::thread::sleep(Duration::from_millis(1500));
    assert!(
        child.try_wait().unwrap().is_none(),
        "the batch finished before the signal; make the input larger"
    );
    let pid = child.id().to_string();
    let sent = Command::new("kill").args(["-INT", &pid]).status().unwrap();
    assert!(sent.success());
    let status = wait_with_deadline(&mut child, Duration::from_secs(30));
    let mut stderr = String::new();
    std::io::Read::read_to_string(&mut child.stderr.take().unwrap(), &mut stderr).unwrap();
    assert_eq!(status.code(), Some(130), "stderr: {stderr}");
    assert!(
        stderr.contains("interrupted") && stderr.contains("no output was written"),
        "stderr: {stderr}"
    );
    assert!(!output.exists(), "a partial output file was left");
    let leftovers: Vec<_> = std::fs::read_dir(dir.path())
        .unwrap()
        .filter_map(|e| e.ok())
        .map(|e| e.file_name().to_string_lossy().into_owned())
        .filter(|n| n != "library.csv")
        .collect();
    assert!(leftovers.is_empty(), "left behind: {leftovers:?}");
}

/// What one interrupted `check` run did.
enum Run {
    /// Exit 130 with this stderr.
    Interrupted(String),
    /// The run ended normally: the signal came too late (after the rows, while
    /// the output was being written, which an interrupt waits for) or never.
    Finished,
}

/// One `check` run with SIGINT sent `after` its start.
fn interrupt_check(input: &std::path::Path, output: &std::path::Path, after: Duration) -> Run {
    let mut child = ebullio()
        .arg("check")
        .arg(input)
        .arg("-o")
        .arg(output)
        .stdin(Stdio::null())
        .stdout(Stdio::null())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    std::thread::sleep(after);
    if child.try_wait().unwrap().is_none() {
        let pid = child.id().to_string();
        assert!(Command::new("kill")
            .args(["-INT", &pid])
            .status()
            .unwrap()
            .success());
    }
    let status = wait_with_deadline(&mut child, Duration::from_secs(30));
    let mut stderr = String::new();
    std::io::Read::read_to_string(&mut child.stderr.take().unwrap(), &mut stderr).unwrap();
    match status.code() {
        Some(130) => Run::Interrupted(stderr),
        Some(0) => Run::Finished,
        other => panic!("exit {other:?}, stderr: {stderr}"),
    }
}

#[test]
fn sigint_during_check_leaves_no_output_and_says_how_many_rows_were_checked() {
    let dir = scratch();
    let input = dir.path().join("sheet.csv");
    const ROWS: usize = 1_000_000;
    {
        // Invented lot rows on the Smith, Van Ness & Abbott B.2 benzene and
        // toluene rows; enough that the check runs for seconds.
        let mut f = std::io::BufWriter::new(std::fs::File::create(&input).unwrap());
        writeln!(f, "compound,Tb/K,A,B,C,convention").unwrap();
        for i in 0..ROWS {
            if i % 2 == 0 {
                writeln!(
                    f,
                    "lot {i} benzene,353.2,13.7819,2726.81,217.572,\"ln,kPa,degC\""
                )
                .unwrap();
            } else {
                writeln!(
                    f,
                    "lot {i} toluene,383.8,13.9320,3056.96,217.625,\"ln,kPa,degC\""
                )
                .unwrap();
            }
        }
    }
    let output = dir.path().join("checked.csv");
    // The rows are read, then checked, then written. Search for a signal
    // time that lands while rows are checked: later after "before the batch
    // started" (doubling the step until a run finishes, since reading takes
    // longer on a loaded machine), earlier (by half the last step) after a
    // run that finished.
    let mut after = Duration::from_millis(1000);
    let mut step = Duration::from_millis(500);
    let mut bracketed = false;
    let mut seen = Vec::new();
    for _ in 0..16 {
        match interrupt_check(&input, &output, after) {
            Run::Finished => {
                // complete output is allowed then; remove it for the next try
                assert!(output.exists());
                std::fs::remove_file(&output).unwrap();
                seen.push(format!("{after:?}: finished"));
                bracketed = true;
                step /= 2;
                after = after.saturating_sub(step);
            }
            Run::Interrupted(stderr) => {
                assert!(stderr.contains("no output was written"), "stderr: {stderr}");
                assert!(!output.exists(), "a partial output file was left");
                let leftovers: Vec<_> = std::fs::read_dir(dir.path())
                    .unwrap()
                    .filter_map(|e| e.ok())
                    .map(|e| e.file_name().to_string_lossy().into_owned())
                    .filter(|n| n != "sheet.csv")
                    .collect();
                assert!(leftovers.is_empty(), "left behind: {leftovers:?}");
                if stderr.contains(&format!(" of {ROWS} items")) {
                    assert!(stderr.contains("interrupted after "), "stderr: {stderr}");
                    return;
                }
                assert!(
                    stderr.contains("before the batch started"),
                    "stderr: {stderr}"
                );
                seen.push(format!("{after:?}: before the batch"));
                after += step;
                if !bracketed {
                    step *= 2;
                }
            }
        }
    }
    panic!("never interrupted while checking rows: {seen:?}");
}
