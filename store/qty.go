package store

import (
	"context"
	"database/sql"
	"errors"
	"fmt"

	"github.com/jmoiron/sqlx"
)

// qtyOf returns the quantity of part id; ErrNotFound when there is none.
func qtyOf(ctx context.Context, tx *sqlx.Tx, id int64) (int, error) {
	var qty int
	err := tx.GetContext(ctx, &qty, `SELECT qty FROM parts WHERE id = ?`, id)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, fmt.Errorf("part %d: %w", id, ErrNotFound)
	}
	return qty, err
}

// Adjust adds delta (negative to take parts out) to the quantity of line
// id and returns the new quantity. A change that would go below zero fails
// with ErrBelowZero and changes nothing; a missing line is ErrNotFound.
func (db *DB) Adjust(ctx context.Context, id int64, delta int) (int, error) {
	var qty int
	err := db.writeFor(ctx, ReasonAdjust, 0, func(tx *sqlx.Tx) error {
		have, err := qtyOf(ctx, tx, id)
		if err != nil {
			return err
		}
		qty = have + delta
		if qty < 0 {
			return fmt.Errorf("%w: part %d has %d, cannot take %d", ErrBelowZero, id, have, -delta)
		}
		if qty > MaxQty {
			return fmt.Errorf("%w: part %d would hold %d, above %d", ErrInvalid, id, qty, MaxQty)
		}
		_, err = tx.ExecContext(ctx, `UPDATE parts SET qty = ? WHERE id = ?`, qty, id)
		return domainError(err)
	})
	if err != nil {
		return 0, fmt.Errorf("adjust part %d: %w", id, err)
	}
	return qty, nil
}

// SetQty sets the quantity of line id (a stock count) and returns it.
func (db *DB) SetQty(ctx context.Context, id int64, qty int) (int, error) {
	if qty < 0 {
		return 0, fmt.Errorf("set part %d: %w: quantity %d is negative", id, ErrBelowZero, qty)
	}
	if qty > MaxQty {
		return 0, fmt.Errorf("set part %d: %w: quantity %d is above %d", id, ErrInvalid, qty, MaxQty)
	}
	err := db.writeFor(ctx, ReasonCount, 0, func(tx *sqlx.Tx) error {
		if _, err := qtyOf(ctx, tx, id); err != nil {
			return err
		}
		_, err := tx.ExecContext(ctx, `UPDATE parts SET qty = ? WHERE id = ?`, qty, id)
		return domainError(err)
	})
	if err != nil {
		return 0, fmt.Errorf("set part %d: %w", id, err)
	}
	return qty, nil
}

// Remove deletes line id with its tags; ErrNotFound when there is none.
// A line an open build holds is refused with a *HeldError naming the
// builds, and stays.
func (db *DB) Remove(ctx context.Context, id int64) error {
	err := db.writeFor(ctx, ReasonRemove, 0, func(tx *sqlx.Tx) error {
		if err := refuseHeld(ctx, tx, id); err != nil {
			return err
		}
		res, err := tx.ExecContext(ctx, `DELETE FROM parts WHERE id = ?`, id)
		if err != nil {
			return err
		}
		if n, err := res.RowsAffected(); err != nil {
			return err
		} else if n == 0 {
			return fmt.Errorf("part %d: %w", id, ErrNotFound)
		}
		return nil
	})
	if err != nil {
		return fmt.Errorf("remove part %d: %w", id, err)
	}
	return nil
}
